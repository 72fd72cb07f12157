import { exp, quote, type Dec } from './decimal'
import { EngineError } from './errors'
import type { TransformDefinition } from './transforms'
import { COMPOUNDING_IDS, CURVE_KINDS, type Compounding, type TableKind } from './types'

/**
 * Spot rates under a stated compounding and ln P(t), the scale every curve method works on. The intensity of a rate r
 * is the continuously compounded rate with the same discount factor, so ln P(t) = -t * intensity(r):
 * annual ln(1 + r), semi-annual 2 ln(1 + r/2), continuous r (Hull, Options, Futures and Other Derivatives, ch. 4).
 */
export function isCurveKind(kind: TableKind): boolean {
  return (CURVE_KINDS as readonly TableKind[]).includes(kind)
}

/** The request's compounding: any of COMPOUNDING_IDS for curve kinds, only the default for other kinds. */
export function resolveCompounding(value: unknown, kind: TableKind): Compounding {
  if (value === undefined || value === null) return 'annual'
  if (typeof value !== 'string' || !(COMPOUNDING_IDS as readonly string[]).includes(value)) {
    throw new EngineError('invalid-request', `Unknown compounding ${quote(value)}; choose one of ${COMPOUNDING_IDS.join(', ')}.`)
  }
  if (value !== 'annual' && !isCurveKind(kind)) {
    throw new EngineError('invalid-request', `Compounding applies to spot-rate and discount-factor tables only; this table's kind is '${kind}'.`)
  }
  return value as Compounding
}

/** Rates the compounding accepts: 1 + r > 0 (annual), 1 + r/2 > 0 (semi-annual), any (continuous). */
export function rateInDomain(r: Dec, c: Compounding): boolean {
  return c === 'continuous' || (c === 'annual' ? r.gt(-1) : r.gt(-2))
}

export const RATE_DOMAIN: Record<Compounding, string> = { 'annual': 'r > -1', 'semi-annual': 'r > -2', 'continuous': 'any r' }

/** Continuously compounded equivalent of r: ln(1 + r), 2 ln(1 + r/2) or r (Hull, ch. 4, conversion between compoundings). */
export function intensityOf(r: Dec, c: Compounding): Dec {
  if (c === 'continuous') return r
  if (c === 'annual') return r.plus(1).ln()
  return r.div(2).plus(1).ln().times(2)
}

/** The rate under c whose intensity is F: e^F - 1, 2 (e^(F/2) - 1) or F (inverse of intensityOf), with the engine's fast exp. */
export function rateOfIntensity(F: Dec, c: Compounding): Dec {
  if (c === 'continuous') return F
  if (c === 'annual') return exp(F).minus(1)
  return exp(F.div(2)).minus(1).times(2)
}

/** As rateOfIntensity with decimal.js's correctly rounded exp, for the few figures the checks and the money view report. */
export function rateOfIntensityExact(F: Dec, c: Compounding): Dec {
  if (c === 'continuous') return F
  if (c === 'annual') return F.exp().minus(1)
  return F.div(2).exp().minus(1).times(2)
}

/** r(0) from the slope of ln P at t = 0: the instantaneous forward -d lnP/dt at 0 as a rate under c (limit of -ln P(t)/t, l'Hopital). */
export function spotRateAtZero(slopeOfLogDiscount: Dec, c: Compounding = 'annual'): Dec {
  return rateOfIntensity(slopeOfLogDiscount.neg(), c)
}

const LABEL: Record<Compounding, string> = { 'annual': 'annual', 'semi-annual': 'semi-annual', 'continuous': 'continuous' }

function makeLogDiscount(c: Compounding): TransformDefinition {
  return {
    id: 'log-discount',
    label: 'Log discount factor',
    domain: `t >= 0 and ${RATE_DOMAIN[c]}`,
    description: c === 'annual'
      ? 'Spot rates r(t) (annual compounding) to ln P(t) = -t ln(1 + r(t)); interpolate; map back with r = exp(-v / t) - 1. '
      + 'At t = 0 the value is the limit exp(-dv/dt) - 1 (the instantaneous forward rate), or the given rate if a knot sits at t = 0.'
      : `Spot rates r(t) (${LABEL[c]} compounding) to ln P(t); interpolate; map back. At t = 0 the value is the instantaneous forward rate, or the given rate if a knot sits at t = 0.`,
    anchorAtZero: true,
    accepts: (x, y) => x.gte(0) && rateInDomain(y, c),
    // ln P(t) = -t intensity(r(t)) (Hull, Options, Futures and Other Derivatives, ch. 4)
    forward: (x, y) => (x.isZero() ? y.times(0) : intensityOf(y, c).times(x).neg()),
    // r = rate of intensity -v/t
    inverse: (x, v) => rateOfIntensity(v.div(x).neg(), c),
  }
}

const LOG_DISCOUNT: Record<Compounding, TransformDefinition> = {
  'annual': makeLogDiscount('annual'),
  'semi-annual': makeLogDiscount('semi-annual'),
  'continuous': makeLogDiscount('continuous'),
}

/** The log-discount transform (spot rate to ln P(t)) under a compounding. */
export function logDiscountTransform(c: Compounding): TransformDefinition {
  return LOG_DISCOUNT[c]
}

/** Discount factors to ln P(t): the scale of the curve methods on a discount-factor table (P(0) = 1 by definition). */
const DISCOUNT_LOG: TransformDefinition = {
  id: 'log',
  label: 'Log discount factor',
  domain: 't >= 0, P > 0, and P = 1 at t = 0',
  description: 'Discount factors P(t) to ln P(t); interpolate; map back with exp.',
  anchorAtZero: true,
  accepts: (x, y) => x.gte(0) && y.gt(0) && (!x.isZero() || y.eq(1)),
  forward: (_x, y) => y.ln(),
  inverse: (_x, v) => exp(v),
}

/** The scale of a curve method (one that works on ln P(t)) for a table kind and compounding. */
export function curveScale(kind: TableKind, c: Compounding): TransformDefinition {
  return kind === 'discount-factor' ? DISCOUNT_LOG : LOG_DISCOUNT[c]
}

/** The scale of a curve method: ln P(t) of the table (the method checked the kind); the request's transform must be 'none'. */
export function curveMethodScale(method: string, kind: TableKind, transform: string, c: Compounding): TransformDefinition {
  if (transform !== 'none') {
    throw new EngineError('invalid-request', `Method ${method} already works on ln P(t); use transform 'none' with it.`)
  }
  return curveScale(kind, c)
}
