import type { Dec, DecimalCtor } from './decimal'
import { assertEqualSpacing } from './knots'
import type { PiecewisePolynomial } from './piecewise'
import { ONE, Rational, ZERO, power, solveExact } from './rational'

/**
 * Osculatory and six-term interpolation of pivotal values at equal spacing h (Karup-King, Sprague, Beers). On the interval
 * [x_i, x_i+1] the value is a polynomial p(s) in s = (x - x_i) / h whose coefficients are fixed linear combinations of nearby
 * pivots: a panel. A method is an interior panel plus its end panels for the first intervals; the last intervals use the
 * mirror images. Panels are derived exactly (rationals) when the module loads, from the method's defining conditions.
 */

/** A linear form over pivots: offset from the interval's left pivot -> weight. */
export type Form = Map<number, Rational>

/** p^(order)(at) = form: one defining condition of a panel. */
export interface Condition { order: number, at: Rational, equals: Form }

/** p(s) = sum_k s^k sum_j weights[k][j] y_{i + offsets[j]}. */
export interface Panel { offsets: number[], weights: Rational[][] }

export interface Scheme {
  interior: Panel
  /** Panels of the first intervals, in order; the last intervals use their mirror images. */
  ends: Panel[]
}

/** k! / (k - order)! (the factor of s^(k - order) in the order-th derivative of s^k). */
function fallingFactor(k: number, order: number): Rational {
  let f = 1n
  for (let j = 0; j < order; j += 1) f *= BigInt(k - j)
  return new Rational(f)
}

/** The polynomial of the given degree meeting the conditions, as a panel (solved exactly). */
export function panelFromConditions(degree: number, conditions: Condition[]): Panel {
  if (conditions.length !== degree + 1) throw new Error(`panel: ${conditions.length} conditions for degree ${degree}`)
  const offsets = [...new Set(conditions.flatMap(c => [...c.equals.keys()]))].sort((a, b) => a - b)
  // row: sum_k a_k d^order/ds^order s^k at `at` = form
  const A = conditions.map(c => Array.from({ length: degree + 1 }, (_, k) => (k < c.order ? ZERO : fallingFactor(k, c.order).times(power(c.at, k - c.order)))))
  const B = conditions.map(c => offsets.map(o => c.equals.get(o) ?? ZERO))
  return { offsets, weights: solveExact(A, B) }
}

/** The polynomial through the pivots at s = offset (degree = count - 1; Lagrange interpolation, solved exactly). */
export function throughPivots(offsets: number[]): Panel {
  return panelFromConditions(offsets.length - 1, offsets.map(o => ({ order: 0, at: new Rational(BigInt(o)), equals: new Map([[o, ONE]]) })))
}

/** The order-th derivative of a panel's polynomial at s = at, as a form over its pivots. */
export function derivativeAt(panel: Panel, order: number, at: Rational): Form {
  const form: Form = new Map()
  panel.offsets.forEach((o, j) => {
    let w = ZERO
    panel.weights.forEach((row, k) => { if (k >= order) w = w.plus(row[j]!.times(fallingFactor(k, order)).times(power(at, k - order))) })
    form.set(o, w)
  })
  return form
}

/** The same form about another pivot: offset o becomes o + by. */
export function shifted(form: Form, by: number): Form {
  return new Map([...form].map(([o, w]) => [o + by, w]))
}

/** q(s) = p(1 - s) on pivots reflected about the interval (offset o -> 1 - o): the panel for the mirror-image interval. */
export function mirrored(panel: Panel): Panel {
  const degree = panel.weights.length - 1
  const offsets = panel.offsets.map(o => 1 - o)
  const order = offsets.map((_, j) => j).sort((a, b) => offsets[a]! - offsets[b]!)
  const weights: Rational[][] = Array.from({ length: degree + 1 }, () => order.map(() => ZERO))
  // (1 - s)^k = sum_m C(k, m) (-s)^m (binomial theorem)
  for (let k = 0; k <= degree; k += 1) {
    let binom = 1n
    for (let m = 0; m <= k; m += 1) {
      if (m > 0) binom = binom * BigInt(k - m + 1) / BigInt(m)
      const factor = new Rational(m % 2 === 0 ? binom : -binom)
      order.forEach((j, jj) => { weights[m]![jj] = weights[m]![jj]!.plus(panel.weights[k]![j]!.times(factor)) })
    }
  }
  return { offsets: order.map(j => offsets[j]!), weights }
}

/** Value of a panel at a rational s for given pivot values (exact): used by tests and the end checks below. */
export function panelValue(panel: Panel, s: Rational, pivot: (offset: number) => Rational): Rational {
  let v = ZERO
  panel.weights.forEach((row, k) => row.forEach((w, j) => { v = v.plus(w.times(power(s, k)).times(pivot(panel.offsets[j]!))) }))
  return v
}

/** Every panel must pass through its interval's two pivots: p(0) = y_i, p(1) = y_i+1. */
function assertInterpolates(panel: Panel, name: string): void {
  for (const end of [0, 1]) {
    for (const o of panel.offsets) {
      const v = panelValue(panel, new Rational(BigInt(end)), p => (p === o ? ONE : ZERO))
      if (!v.eq(o === end ? ONE : ZERO)) throw new Error(`${name}: a panel does not pass through its pivots`)
    }
  }
}

/** A panel ready for decimal work: per power of s, integer weights over one common denominator. */
interface ReadyPanel { offsets: number[], rows: { numerators: bigint[], denominator: bigint }[] }

function ready(panel: Panel): ReadyPanel {
  return {
    offsets: panel.offsets,
    rows: panel.weights.map((row) => {
      const denominator = row.reduce((l, w) => lcm(l, w.d), 1n)
      return { numerators: row.map(w => w.n * (denominator / w.d)), denominator }
    }),
  }
}

function lcm(a: bigint, b: bigint): bigint {
  let x = a
  let y = b
  while (y !== 0n) [x, y] = [y, x % y]
  return a / x * b
}

export interface PreparedScheme { name: string, interior: ReadyPanel, first: ReadyPanel[], last: ReadyPanel[] }

/** Check and prepare a scheme once, at module load. */
export function prepareScheme(name: string, scheme: Scheme): PreparedScheme {
  const all = [scheme.interior, ...scheme.ends]
  all.forEach(p => assertInterpolates(p, name))
  return { name, interior: ready(scheme.interior), first: scheme.ends.map(ready), last: scheme.ends.map(p => ready(mirrored(p))) }
}

/**
 * The pieces: interval i takes the first end panels at the start, the mirrored ones at the end, the interior panel between;
 * a_k = sum_j w_kj y_{i + o_j} (one rounding at the working precision), then c_k = a_k / h^k for the local variable x - x_i.
 */
export function fitScheme(scheme: PreparedScheme, x: Dec[], y: Dec[], D: DecimalCtor): PiecewisePolynomial {
  const h = assertEqualSpacing(`Method ${scheme.name}`, 'pivotal values at a fixed step', x, 'Use a spline, PCHIP or Akima for unequal spacing.')
  const n = x.length - 1
  const coefs: Dec[][] = []
  const hPowers: Dec[] = [new D(1)]
  for (let i = 0; i < n; i += 1) {
    const fromEnd = n - 1 - i
    const panel = i < scheme.first.length && i <= fromEnd ? scheme.first[i]! : fromEnd < scheme.last.length ? scheme.last[fromEnd]! : scheme.interior
    const c: Dec[] = panel.rows.map((row, k) => {
      if (k === 0) return y[i]! // every panel passes through its pivots (checked at load)
      let sum = new D(0)
      row.numerators.forEach((w, j) => {
        if (w === 0n) return
        const pivot = y[i + panel.offsets[j]!]
        if (pivot === undefined) throw new Error(`${scheme.name}: a panel reaches beyond the pivots`)
        sum = sum.plus(pivot.times(w.toString()))
      })
      while (hPowers.length <= k) hPowers.push(hPowers[hPowers.length - 1]!.times(h))
      return sum.div(row.denominator.toString()).div(hPowers[k]!)
    })
    coefs.push(c)
  }
  return { breaks: x, coefs, endValue: y[n]! }
}
