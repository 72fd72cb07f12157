import type { Dec } from './decimal'
import type { ConvergenceReport } from './types'

/**
 * A piecewise polynomial: on [breaks[i], breaks[i+1]) the value is sum_k coefs[i][k] * t^k with t = x - breaks[i]
 * (local coordinates, as SciPy's PPoly). Every method produces one; one evaluator serves them all.
 */
export interface PiecewisePolynomial {
  breaks: Dec[]
  coefs: Dec[][]
  /** Value at the last break: the last knot's value, kept exactly rather than re-evaluated from the last piece. */
  endValue: Dec
  /** Set by a method that is not polynomial between its knots (Smith-Wilson): it evaluates itself, and coefs is empty. */
  closedForm?: ClosedForm
}

/** A fitted function given by a formula rather than pieces; breaks still mark the knots it was fitted to. */
export interface ClosedForm {
  /** Values on the method's scale at xs (any order, none below the first break), rounded to `digits` significant digits. */
  evaluate(xs: Dec[], digits: number): Dec[]
  /** First or second derivative on the method's scale at x. */
  derivative(x: Dec, order: 1 | 2): Dec
  /** What the fit has to say beside the result (knots it left out, a calibration). */
  notes?: string[]
  /** The convergence check of a method that converges to an ultimate forward rate (computed when the checks ask). */
  convergence?: () => ConvergenceReport
}

/** Horner's rule: c0 + t (c1 + t (c2 + t c3)) (Horner 1819; Knuth, TAOCP vol. 2, 4.6.4). */
export function horner(c: Dec[], t: Dec): Dec {
  let k = c.length - 1
  let v = c[k]!
  while (k > 0) {
    k -= 1
    v = v.times(t).plus(c[k]!)
  }
  return v
}

/** d-th derivative of a local polynomial at t: sum_k k!/(k-d)! c_k t^(k-d) (termwise differentiation). */
export function hornerDerivative(c: Dec[], t: Dec, order: number): Dec {
  const reduced: Dec[] = []
  for (let k = order; k < c.length; k += 1) {
    let factor = 1
    for (let j = 0; j < order; j += 1) factor *= k - j
    reduced.push(c[k]!.times(factor))
  }
  if (reduced.length === 0) return c[0]!.times(0)
  return horner(reduced, t)
}

/** Slope of the first piece at the first knot and of the last piece at the last knot. */
export function endSlopes(pp: PiecewisePolynomial): { left: Dec, right: Dec } {
  const n = pp.coefs.length
  const first = pp.coefs[0]!
  const last = pp.coefs[n - 1]!
  const h = pp.breaks[n]!.minus(pp.breaks[n - 1]!)
  return { left: hornerDerivative(first, h.times(0), 1), right: hornerDerivative(last, h, 1) }
}

/** Global power-basis coefficients [a0, a1, a2, ...] of piece i (value = sum a_k x^k), by binomial expansion of (x - x_i)^k. */
export function globalCoefficients(pp: PiecewisePolynomial, i: number): Dec[] {
  const c = pp.coefs[i]!
  const xi = pp.breaks[i]!
  const zero = xi.times(0)
  const out: Dec[] = c.map(() => zero)
  for (let k = 0; k < c.length; k += 1) {
    // (x - xi)^k = sum_j C(k, j) x^j (-xi)^(k-j)  (binomial theorem)
    let binom = 1
    for (let j = 0; j <= k; j += 1) {
      if (j > 0) binom = (binom * (k - j + 1)) / j
      out[j] = out[j]!.plus(c[k]!.times(binom).times(xi.neg().pow(k - j)))
    }
  }
  return out
}
