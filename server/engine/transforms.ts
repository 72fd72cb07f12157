import { logDiscountTransform } from './compounding'
import { exp, type Dec } from './decimal'
import type { TransformId } from './types'

/**
 * A transform maps a knot value y (at abscissa x) to the scale the method interpolates on, and back.
 * ln and exp are costly in decimal.js at 40+ digits: forward runs once per knot, inverse once per output point.
 */
export interface TransformDefinition {
  id: TransformId
  label: string
  /** The values the transform accepts, for messages. */
  domain: string
  description: string
  /** ln P(0) = 0 by definition: the point (0, 0) is added to the knots when no knot sits at t = 0. */
  anchorAtZero?: boolean
  accepts(x: Dec, y: Dec): boolean
  forward(x: Dec, y: Dec): Dec
  inverse(x: Dec, v: Dec): Dec
}

const none: TransformDefinition = {
  id: 'none',
  label: 'None',
  domain: 'any value',
  description: 'The method interpolates y itself.',
  accepts: () => true,
  forward: (_x, y) => y,
  inverse: (_x, v) => v,
}

const log: TransformDefinition = {
  id: 'log',
  label: 'Logarithm',
  domain: 'y > 0',
  description: 'Interpolate ln y, map back with exp: results stay positive; for q_x, linear on ln q is exponential (Gompertz-like) between points.',
  accepts: (_x, y) => y.gt(0),
  forward: (_x, y) => y.ln(),
  inverse: (_x, v) => exp(v),
}

const logit: TransformDefinition = {
  id: 'logit',
  label: 'Logit',
  domain: '0 < y < 1',
  description: 'Interpolate ln(y / (1 - y)), map back with 1 / (1 + exp(-v)): results stay strictly between 0 and 1.',
  accepts: (_x, y) => y.gt(0) && y.lt(1),
  // logit q = ln(q / (1 - q)) (Brass 1971 relational logit; Berkson 1944)
  forward: (_x, y) => y.div(y.neg().plus(1)).ln(),
  inverse: (_x, v) => exp(v.neg()).plus(1).pow(-1),
}

const cumulativeHazard: TransformDefinition = {
  id: 'cumulative-hazard',
  label: 'One-year cumulative hazard',
  domain: '0 <= y < 1',
  description: 'Interpolate h_x = -ln(1 - q_x), the hazard accumulated over the year of age [x, x+1] (the integral of mu over that year), '
    + 'map back with q = 1 - exp(-h). Summing h over an integer-age table gives -ln(l_x / l_first) exactly. See docs/methods.md for why -ln l_x itself is not interpolated.',
  accepts: (_x, y) => y.gte(0) && y.lt(1),
  // -ln(1 - q_x) = integral_x^{x+1} mu_s ds (p_x = exp(-integral of mu over the year); Dickson, Hardy and Waters, AMLCR, survival models)
  forward: (_x, y) => y.neg().plus(1).ln().neg(),
  inverse: (_x, v) => exp(v.neg()).neg().plus(1),
}

export const TRANSFORMS: Record<TransformId, TransformDefinition> = {
  'none': none,
  'log': log,
  'logit': logit,
  'cumulative-hazard': cumulativeHazard,
  // spot rates under annual compounding; other compoundings in compounding.ts
  'log-discount': logDiscountTransform('annual'),
}
