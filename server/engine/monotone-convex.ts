import type { Dec } from './decimal'
import type { PiecewisePolynomial } from './piecewise'

// Monotone convex interpolation (Hagan and West 2006, "Interpolation methods for curve construction", Applied Mathematical
// Finance 13(2), section 4; Hagan and West 2008, "Methods for constructing a yield curve", Wilmott). Given ln P at terms
// tau_0 = 0 < tau_1 < ... < tau_n, the instantaneous forward f on (tau_{i-1}, tau_i) is f_i^d + g(x), x = (t - tau_{i-1}) / h_i,
// where f_i^d is the discrete forward and g integrates to 0 over [0, 1], so every discrete forward is kept. ln P is then
// ln P(tau_{i-1}) minus the integral of f: a cubic in t on each piece (more pieces where g has a break eta inside the interval).

/** Discrete forwards f_i^d = -(ln P_i - ln P_{i-1}) / (tau_i - tau_{i-1}), i = 1..n (Hagan and West 2006, eq. for f^d). */
export function discreteForwards(tau: Dec[], lnP: Dec[]): Dec[] {
  const fd: Dec[] = []
  for (let i = 1; i < tau.length; i += 1) fd.push(lnP[i - 1]!.minus(lnP[i]!).div(tau[i]!.minus(tau[i - 1]!)))
  return fd
}

/**
 * Instantaneous forwards at the knots. Interior: f_i = h_i/(h_i + h_{i+1}) f_{i+1}^d + h_{i+1}/(h_i + h_{i+1}) f_i^d; ends:
 * f_0 = f_1^d - (f_1 - f_1^d)/2, f_n = f_n^d - (f_{n-1} - f_n^d)/2 (Hagan and West 2006, section 4). With positivity, each is
 * bounded to [0, 2 min of its neighbouring discrete forwards] (their positivity step), which keeps every forward of an
 * interval with a positive discrete forward positive; where a neighbour is not positive only the positive ones bound it.
 */
export function knotForwards(tau: Dec[], fd: Dec[], positivity: boolean): Dec[] {
  const n = fd.length
  const f: Dec[] = new Array<Dec>(n + 1)
  if (n === 1) {
    f[0] = fd[0]!
    f[1] = fd[0]!
  }
  else {
    for (let i = 1; i < n; i += 1) {
      const hL = tau[i]!.minus(tau[i - 1]!)
      const hR = tau[i + 1]!.minus(tau[i]!)
      f[i] = hL.times(fd[i]!).plus(hR.times(fd[i - 1]!)).div(hL.plus(hR))
    }
    f[0] = fd[0]!.minus(f[1]!.minus(fd[0]!).div(2))
    f[n] = fd[n - 1]!.minus(f[n - 1]!.minus(fd[n - 1]!).div(2))
  }
  if (!positivity) return f
  return f.map((value, i) => {
    const positive = [fd[i - 1], fd[i]].filter((d): d is Dec => d !== undefined && d.gt(0))
    if (positive.length === 0) return value
    const hi = positive.reduce((a, b) => (a.lt(b) ? a : b)).times(2)
    return value.isNegative() ? value.times(0) : value.gt(hi) ? hi : value
  })
}

/** f on a sub-piece of width w: f(s + u) = a + b u + c u^2 for u in [0, w]. */
interface ForwardPiece { w: Dec, a: Dec, b: Dec, c: Dec }

/**
 * The forward on one interval as one or two quadratic pieces, by the region of (g0, g1) = (f_{i-1} - f^d, f_i - f^d)
 * (Hagan and West 2006, section 4, regions (i) to (iv)). Widths are worked out so that f integrates to f^d h exactly.
 */
export function intervalForward(h: Dec, fd: Dec, g0: Dec, g1: Dec): ForwardPiece[] {
  const zero = h.times(0)
  const flat = (w: Dec, level: Dec): ForwardPiece => ({ w, a: level, b: zero, c: zero })
  if (g0.isZero() && g1.isZero()) return [flat(h, fd)]
  const half = g0.neg().div(2)
  const twice = g0.neg().times(2)
  if ((g0.isNegative() && g1.gte(half) && g1.lte(twice)) || (g0.isPositive() && g1.lte(half) && g1.gte(twice))) {
    // (i) g(x) = g0 (1 - 4x + 3x^2) + g1 (-2x + 3x^2)
    return [{ w: h, a: fd.plus(g0), b: g0.times(-4).minus(g1.times(2)).div(h), c: g0.plus(g1).times(3).div(h).div(h) }]
  }
  if ((g0.isNegative() && g1.gt(twice)) || (g0.isPositive() && g1.lt(twice))) {
    // (ii) g = g0 on [0, eta], g0 + (g1 - g0) ((x - eta)/(1 - eta))^2 after; (1 - eta) h = 3 g0 h / (g0 - g1)
    const W = g0.times(3).times(h).div(g0.minus(g1))
    return nonEmpty([flat(h.minus(W), fd.plus(g0)), { w: W, a: fd.plus(g0), b: zero, c: g1.minus(g0).div(W).div(W) }])
  }
  if ((g0.isPositive() && g1.isNegative() && g1.gt(half)) || (g0.isNegative() && g1.isPositive() && g1.lt(half))) {
    // (iii) g = g1 + (g0 - g1) ((eta - x)/eta)^2 on [0, eta], g1 after; eta h = 3 g1 h / (g1 - g0)
    const E = g1.times(3).times(h).div(g1.minus(g0))
    const d = g0.minus(g1)
    return nonEmpty([{ w: E, a: fd.plus(g0), b: d.times(-2).div(E), c: d.div(E).div(E) }, flat(h.minus(E), fd.plus(g1))])
  }
  // (iv) same signs: A = -g0 g1 / (g0 + g1), eta h = g1 h / (g0 + g1); A + (g0 - A)((eta - x)/eta)^2, then A + (g1 - A)((x - eta)/(1 - eta))^2
  const A = g0.times(g1).neg().div(g0.plus(g1))
  const E = g1.times(h).div(g0.plus(g1))
  const W = h.minus(E)
  const first: ForwardPiece = E.isZero() ? flat(E, fd) : { w: E, a: fd.plus(g0), b: g0.minus(A).times(-2).div(E), c: g0.minus(A).div(E).div(E) }
  const second: ForwardPiece = W.isZero() ? flat(W, fd) : { w: W, a: fd.plus(A), b: zero, c: g1.minus(A).div(W).div(W) }
  return nonEmpty([first, second])
}

function nonEmpty(pieces: ForwardPiece[]): ForwardPiece[] {
  return pieces.filter(p => p.w.gt(0))
}

/** Two pieces whose inner break would round onto an end of the interval (a width below the working precision) become the wider one. */
function insideInterval(from: Dec, to: Dec, pieces: ForwardPiece[]): ForwardPiece[] {
  if (pieces.length < 2) return pieces
  const inner = from.plus(pieces[0]!.w)
  if (inner.gt(from) && inner.lt(to)) return pieces
  const wider = pieces[0]!.w.gt(pieces[1]!.w) ? pieces[0]! : pieces[1]!
  return [{ ...wider, w: to.minus(from) }]
}

/**
 * ln P as a piecewise cubic: on a forward piece starting at s with ln P = L there, ln P(s + u) = L - a u - b u^2/2 - c u^3/3
 * (the integral of f). Each interval starts from its given ln P, so every knot is kept exactly.
 */
export function monotoneConvexPieces(tau: Dec[], lnP: Dec[], positivity: boolean): PiecewisePolynomial {
  const fd = discreteForwards(tau, lnP)
  const f = knotForwards(tau, fd, positivity)
  const breaks: Dec[] = []
  const coefs: Dec[][] = []
  for (let i = 1; i < tau.length; i += 1) {
    const h = tau[i]!.minus(tau[i - 1]!)
    const fdi = fd[i - 1]!
    let start = tau[i - 1]!
    let L = lnP[i - 1]!
    for (const p of insideInterval(tau[i - 1]!, tau[i]!, intervalForward(h, fdi, f[i - 1]!.minus(fdi), f[i]!.minus(fdi)))) {
      breaks.push(start)
      const c = [L, p.a.neg(), p.b.div(2).neg(), p.c.div(3).neg()]
      coefs.push(c)
      // ln P at the end of this piece: L - (a w + b w^2/2 + c w^3/3)
      L = c[0]!.plus(p.w.times(c[1]!.plus(p.w.times(c[2]!.plus(p.w.times(c[3]!))))))
      start = start.plus(p.w)
    }
  }
  breaks.push(tau[tau.length - 1]!)
  return { breaks, coefs, endValue: lnP[lnP.length - 1]! }
}
