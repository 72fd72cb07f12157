import type { Dec } from './decimal'
import { hermitePieces, secants } from './hermite'
import type { PiecewisePolynomial } from './piecewise'
import { solveTridiagonal, type TridiagonalSystem } from './tridiagonal'

/** An end condition of a C2 cubic spline, as data (the solver below is shared by all of them). */
export type EndCondition =
  | { type: 'first-derivative', value: Dec }
  | { type: 'second-derivative', value: Dec }
  | { type: 'not-a-knot' }

/**
 * C2 cubic spline through (x_i, y_i), solved for the knot slopes s_i (as scipy.interpolate.CubicSpline).
 * Interior rows: h_i s_{i-1} + 2 (h_{i-1} + h_i) s_i + h_{i-1} s_{i+1} = 3 (h_i m_{i-1} + h_{i-1} m_i)
 * (de Boor, A Practical Guide to Splines, 2001, ch. IV, slope form of cubic spline interpolation; SciPy _cubic.py).
 */
export function cubicSpline(x: Dec[], y: Dec[], start: EndCondition, end: EndCondition): PiecewisePolynomial {
  const n = x.length
  const { h, m } = secants(x, y)
  const zero = x[0]!.times(0)
  // SciPy: with two points a not-a-knot end becomes "slope = the secant" (a straight line).
  if (n === 2) {
    if (start.type === 'not-a-knot') start = { type: 'first-derivative', value: m[0]! }
    if (end.type === 'not-a-knot') end = { type: 'first-derivative', value: m[0]! }
  }
  const sys: TridiagonalSystem = {
    lower: new Array<Dec>(n).fill(zero),
    diag: new Array<Dec>(n).fill(zero),
    upper: new Array<Dec>(n).fill(zero),
    rhs: new Array<Dec>(n).fill(zero),
  }
  for (let i = 1; i < n - 1; i += 1) {
    sys.lower[i] = h[i]!
    sys.diag[i] = h[i - 1]!.plus(h[i]!).times(2)
    sys.upper[i] = h[i - 1]!
    sys.rhs[i] = h[i]!.times(m[i - 1]!).plus(h[i - 1]!.times(m[i]!)).times(3)
  }
  if (n === 3 && start.type === 'not-a-knot' && end.type === 'not-a-knot') {
    // Three points, not-a-knot at both ends: the parabola through them; s_0 + s_1 = 2 m_0, s_1 + s_2 = 2 m_1 (SciPy CubicSpline).
    sys.diag[0] = zero.plus(1); sys.upper[0] = zero.plus(1); sys.rhs[0] = m[0]!.times(2)
    sys.lower[2] = zero.plus(1); sys.diag[2] = zero.plus(1); sys.rhs[2] = m[1]!.times(2)
  }
  else {
    startRow(sys, x, y, h, m, start)
    endRow(sys, x, y, h, m, end)
  }
  return hermitePieces(x, y, solveTridiagonal(sys))
}

function startRow(sys: TridiagonalSystem, x: Dec[], y: Dec[], h: Dec[], m: Dec[], bc: EndCondition): void {
  const one = h[0]!.times(0).plus(1)
  if (bc.type === 'first-derivative') {
    // s_0 = given slope
    sys.diag[0] = one; sys.upper[0] = one.minus(1); sys.rhs[0] = bc.value
  }
  else if (bc.type === 'second-derivative') {
    // 2 h_0 s_0 + h_0 s_1 = 3 (y_1 - y_0) - v h_0^2 / 2 (second derivative v at x_0; SciPy CubicSpline bc (2, v))
    sys.diag[0] = h[0]!.times(2); sys.upper[0] = h[0]!
    sys.rhs[0] = y[1]!.minus(y[0]!).times(3).minus(bc.value.times(h[0]!).times(h[0]!).div(2))
  }
  else {
    // Not-a-knot (third derivative continuous at x_1): h_1 s_0 + (x_2 - x_0) s_1 = ((h_0 + 2d) h_1 m_0 + h_0^2 m_1)/d, d = x_2 - x_0 (SciPy)
    const d = x[2]!.minus(x[0]!)
    sys.diag[0] = h[1]!; sys.upper[0] = d
    sys.rhs[0] = h[0]!.plus(d.times(2)).times(h[1]!).times(m[0]!).plus(h[0]!.times(h[0]!).times(m[1]!)).div(d)
  }
}

function endRow(sys: TridiagonalSystem, x: Dec[], y: Dec[], h: Dec[], m: Dec[], bc: EndCondition): void {
  const n = x.length
  const k = h.length - 1
  const one = h[0]!.times(0).plus(1)
  if (bc.type === 'first-derivative') {
    // s_n = given slope
    sys.diag[n - 1] = one; sys.lower[n - 1] = one.minus(1); sys.rhs[n - 1] = bc.value
  }
  else if (bc.type === 'second-derivative') {
    // h s_{n-1} + 2 h s_n = 3 (y_n - y_{n-1}) + v h^2 / 2 (second derivative v at x_n; SciPy CubicSpline bc (2, v))
    sys.diag[n - 1] = h[k]!.times(2); sys.lower[n - 1] = h[k]!
    sys.rhs[n - 1] = y[n - 1]!.minus(y[n - 2]!).times(3).plus(bc.value.times(h[k]!).times(h[k]!).div(2))
  }
  else {
    // Not-a-knot at x_{n-1}: (x_n - x_{n-2}) s_{n-1} + h_{n-2} s_n = (h_{n-1}^2 m_{n-2} + (2d + h_{n-1}) h_{n-2} m_{n-1})/d (SciPy)
    const d = x[n - 1]!.minus(x[n - 3]!)
    sys.diag[n - 1] = h[k - 1]!; sys.lower[n - 1] = d
    sys.rhs[n - 1] = h[k]!.times(h[k]!).times(m[k - 1]!).plus(d.times(2).plus(h[k]!).times(h[k - 1]!).times(m[k]!)).div(d)
  }
}
