import { derivativeAt, fitScheme, panelFromConditions, prepareScheme, shifted, throughPivots } from '../osculatory'
import { ONE, ZERO } from '../rational'
import type { MethodDefinition } from './method'

// Karup (1898), King (1887): on [x_i, x_i+1] the cubic through y_i, y_i+1 whose slopes at both pivots are those of the
// parabola through the pivot and its two neighbours (Greville, "The general theory of osculatory interpolation", TASA 45, 1944).
const parabolaSlope = derivativeAt(throughPivots([-1, 0, 1]), 1, ZERO)
const interior = panelFromConditions(3, [
  { order: 0, at: ZERO, equals: new Map([[0, ONE]]) },
  { order: 1, at: ZERO, equals: parabolaSlope },
  { order: 0, at: ONE, equals: new Map([[1, ONE]]) },
  { order: 1, at: ONE, equals: shifted(parabolaSlope, 1) },
])
// End panel: the parabola through the first three pivots, whose slope at x_1 is the interior's (so the curve stays C1).
const SCHEME = prepareScheme('karup-king', { interior, ends: [throughPivots([0, 1, 2])] })

export const karupKing: MethodDefinition = {
  id: 'karup-king',
  label: 'Karup-King osculatory',
  minPoints: 3,
  appliesTo: { spacing: 'equal' },
  source: 'Karup-King four-point osculatory formula (King 1887, Karup 1898; Greville, TASA 45, 1944); end panels: the parabola through the first or last three pivots (as in the handbook multiplier tables, e.g. Siegel and Swanson, The Methods and Materials of Demography, 2nd ed., 2004, App. C).',
  summary: 'Cubic pieces through every pivotal value with slopes from the neighbouring pivots: continuous slope (C1), local (four pivots per interval), reproduces quadratics. Equally spaced pivots only.',
  options: [],
  fit(x, y, _options, D) {
    return fitScheme(SCHEME, x, y, D)
  },
}
