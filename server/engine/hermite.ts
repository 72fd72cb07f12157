import type { Dec } from './decimal'
import type { PiecewisePolynomial } from './piecewise'

/**
 * Cubic Hermite pieces from values y_i and slopes s_i at the knots, in local coordinates t = x - x_i:
 * c0 = y_i, c1 = s_i, c2 = (m_i - s_i)/h_i - w, c3 = w/h_i with m_i = (y_{i+1}-y_i)/h_i and w = (s_i + s_{i+1} - 2 m_i)/h_i
 * (de Boor, A Practical Guide to Splines, 2001, ch. IV (the cubic Hermite form); as scipy.interpolate.CubicHermiteSpline).
 * Shared by the cubic splines, PCHIP and Akima, which differ only in how they choose the slopes.
 */
export function hermitePieces(x: Dec[], y: Dec[], s: Dec[]): PiecewisePolynomial {
  const coefs: Dec[][] = []
  for (let i = 0; i + 1 < x.length; i += 1) {
    const h = x[i + 1]!.minus(x[i]!)
    const m = y[i + 1]!.minus(y[i]!).div(h)
    const w = s[i]!.plus(s[i + 1]!).minus(m.times(2)).div(h)
    coefs.push([y[i]!, s[i]!, m.minus(s[i]!).div(h).minus(w), w.div(h)])
  }
  return { breaks: x, coefs, endValue: y[y.length - 1]! }
}

/** Secant slopes m_i = (y_{i+1} - y_i) / (x_{i+1} - x_i) and spacings h_i (definition). */
export function secants(x: Dec[], y: Dec[]): { h: Dec[], m: Dec[] } {
  const h: Dec[] = []
  const m: Dec[] = []
  for (let i = 0; i + 1 < x.length; i += 1) {
    h.push(x[i + 1]!.minus(x[i]!))
    m.push(y[i + 1]!.minus(y[i]!).div(h[i]!))
  }
  return { h, m }
}
