import { derivativeAt, fitScheme, panelFromConditions, prepareScheme, shifted, throughPivots } from '../osculatory'
import { ONE, ZERO } from '../rational'
import type { MethodDefinition } from './method'

// Sprague (1880), JIA 22: on [x_i, x_i+1] the quintic through y_i, y_i+1 whose first and second derivatives at each pivot are
// those of the quartic through that pivot and its four nearest neighbours (Greville, TASA 45, 1944).
const quartic = throughPivots([-2, -1, 0, 1, 2])
const d1 = derivativeAt(quartic, 1, ZERO)
const d2 = derivativeAt(quartic, 2, ZERO)
const interior = panelFromConditions(5, [
  { order: 0, at: ZERO, equals: new Map([[0, ONE]]) },
  { order: 1, at: ZERO, equals: d1 },
  { order: 2, at: ZERO, equals: d2 },
  { order: 0, at: ONE, equals: new Map([[1, ONE]]) },
  { order: 1, at: ONE, equals: shifted(d1, 1) },
  { order: 2, at: ONE, equals: shifted(d2, 1) },
])
// End panels: the first two intervals follow the quartic through the first five pivots (the last two, the last five), as in the
// handbook multiplier tables; at x_2 its derivatives are the interior's, so the curve stays C2.
const SCHEME = prepareScheme('sprague', { interior, ends: [throughPivots([0, 1, 2, 3, 4]), throughPivots([-1, 0, 1, 2, 3])] })

export const sprague: MethodDefinition = {
  id: 'sprague',
  label: 'Sprague osculatory',
  minPoints: 5,
  appliesTo: { spacing: 'equal' },
  source: 'Sprague fifth-difference osculatory formula (Sprague 1880, JIA 22; Greville, TASA 45, 1944); end panels: the quartic through the first or last five pivots (Siegel and Swanson, The Methods and Materials of Demography, 2nd ed., 2004, App. C).',
  summary: 'Quintic pieces through every pivotal value, twice continuously differentiable (C2), six pivots per interval, reproduces polynomials up to degree 4. Equally spaced pivots only.',
  options: [],
  fit(x, y, _options, D) {
    return fitScheme(SCHEME, x, y, D)
  },
}
