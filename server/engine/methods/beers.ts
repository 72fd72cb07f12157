import type { Dec } from '../decimal'
import { fitScheme, panelFromConditions, prepareScheme, type Condition } from '../osculatory'
import { ONE, Rational, ZERO } from '../rational'
import type { MethodDefinition } from './method'

/**
 * Beers' ordinary six-term formula (Beers 1945, "Six-term formulas for routine actuarial interpolation", RAIA 34): the values at
 * x_i + h/5, 2h/5, 3h/5, 4h/5 from six pivots, exact for polynomials up to degree 4, with the remaining freedom chosen to
 * minimise fifth differences. Coefficients as published to four decimals (pivotal form: partial sums of the group multipliers of
 * Siegel and Swanson, The Methods and Materials of Demography, 2nd ed., 2004, App. C). Rows: s = 1/5 .. 4/5; columns: the pivots.
 */
const PANELS: { offsets: number[], fifths: string[][] }[] = [
  { offsets: [0, 1, 2, 3, 4, 5], fifths: [ // first interval
    ['0.6667', '0.4969', '-0.1426', '-0.1006', '0.1079', '-0.0283'],
    ['0.4072', '0.8344', '-0.2336', '-0.0976', '0.1224', '-0.0328'],
    ['0.2148', '1.0204', '-0.2456', '-0.0536', '0.0884', '-0.0244'],
    ['0.0819', '1.0689', '-0.1666', '-0.0126', '0.0399', '-0.0115']] },
  { offsets: [-1, 0, 1, 2, 3, 4], fifths: [ // second interval
    ['-0.0404', '0.8404', '0.2344', '-0.0216', '-0.0196', '0.0068'],
    ['-0.0497', '0.6229', '0.5014', '-0.0646', '-0.0181', '0.0081'],
    ['-0.0389', '0.3849', '0.7534', '-0.1006', '-0.0041', '0.0053'],
    ['-0.0191', '0.1659', '0.9354', '-0.0906', '0.0069', '0.0015']] },
  { offsets: [-2, -1, 0, 1, 2, 3], fifths: [ // interior
    ['0.0117', '-0.0921', '0.9234', '0.1854', '-0.0311', '0.0027'],
    ['0.0137', '-0.1101', '0.7194', '0.4454', '-0.0771', '0.0087'],
    ['0.0087', '-0.0771', '0.4454', '0.7194', '-0.1101', '0.0137'],
    ['0.0027', '-0.0311', '0.1854', '0.9234', '-0.0921', '0.0117']] },
]

/**
 * Between the fifths the formula says nothing; the engine takes the quintic through the interval's six values at s = 0, 1/5, ...,
 * 1 (so the published values are met exactly at the fifths, and quartics, which those six values follow, stay exact everywhere).
 */
function panel(p: { offsets: number[], fifths: string[][] }) {
  const conditions: Condition[] = [
    { order: 0, at: ZERO, equals: new Map([[0, ONE]]) },
    ...p.fifths.map((row, m) => ({ order: 0, at: new Rational(BigInt(m + 1), 5n), equals: new Map(row.map((w, j) => [p.offsets[j]!, Rational.of(w)])) })),
    { order: 0, at: ONE, equals: new Map([[1, ONE]]) },
  ]
  return panelFromConditions(5, conditions)
}

const SCHEME = prepareScheme('beers', { interior: panel(PANELS[2]!), ends: [panel(PANELS[0]!), panel(PANELS[1]!)] })

export const beers: MethodDefinition = {
  id: 'beers',
  label: 'Beers ordinary six-term',
  minPoints: 6,
  appliesTo: { spacing: 'equal' },
  source: 'Beers ordinary six-term minimised-fifth-difference formula (Beers 1945, RAIA 34), coefficients to four decimals as published (Siegel and Swanson, The Methods and Materials of Demography, 2nd ed., 2004, App. C); between the fifths, the quintic through them.',
  summary: 'Passes through every pivotal value and gives the published values at fifths of the step, with smaller fifth differences than Sprague; reproduces polynomials up to degree 4. Not smooth between the fifths: the slope may jump at the pivots. Equally spaced pivots only.',
  options: [],
  fit(x, y, _options, D) {
    return fitScheme(SCHEME, x, y, D)
  },
  notes(knots: Dec[], points: Dec[]) {
    if (knots.length < 2) return []
    const h = knots[1]!.minus(knots[0]!)
    const off = points.filter(x => !x.minus(knots[0]!).times(5).div(h).isInteger()).length
    return off ? [`beers: ${off} point(s) are not at fifths of the pivot step (${h.toString()}); there the values come from the quintic through the published fifths, not from Beers' table.`] : []
  },
}
