import { decimalContext, exp, roundTo, type Dec, type DecimalCtor } from './decimal'
import { ln } from './ln'
import { solveSymmetric } from './dense-solve'
import { EngineError } from './errors'

// Smith-Wilson, zero-coupon formulation (Smith and Wilson 2001; EIOPA, "Technical documentation of the methodology to
// derive EIOPA's risk-free interest rate term structures", the Smith-Wilson chapter). With omega = ln(1 + UFR):
//   P(t) = e^{-omega t} + sum_j zeta_j W(t, u_j),
//   W(t, u) = e^{-omega (t + u)} (alpha min(t, u) - e^{-alpha max(t, u)} sinh(alpha min(t, u))),
// and zeta solves W zeta = m - e^{-omega u} at the given terms u_j with prices m_j. Writing b_j = zeta_j e^{-omega u_j} and
// H(t, u) = alpha min - e^{-alpha max} sinh(alpha min), this is P(t) = e^{-omega t} G(t), G(t) = 1 + sum_j b_j H(t, u_j),
// with H b = m e^{omega u} - 1: the same system without the exponential weights (H is symmetric).

/** G(t) = A + B t + C e^{-alpha t} + D sinh(alpha t) on [u_k, u_{k+1}) (u_0 = 0; the last piece has no end). */
interface WilsonPiece { A: Dec, B: Dec, C: Dec, D: Dec }

export interface WilsonFit {
  omega: Dec
  alpha: Dec
  /** The given terms used (ascending, all > 0). */
  u: Dec[]
  b: Dec[]
  pieces: WilsonPiece[]
}

/** Solve the Wilson system for terms u (> 0) with ln P values lnP, at `digits` significant digits. */
export function fitWilson(u: Dec[], lnP: Dec[], omega: Dec, alpha: Dec, digits: number): WilsonFit {
  const S = decimalContext(digits)
  const a = new S(alpha)
  const w = new S(omega)
  const us = u.map(v => new S(v))
  const grow = us.map(v => exp(a.times(v))) // e^{alpha u_j}
  const sinh = grow.map(e => e.minus(new S(1).div(e)).div(2))
  // H_ij = alpha u_i - e^{-alpha u_j} sinh(alpha u_i) for u_i <= u_j (symmetric)
  const H = us.map((_, i) => us.map((__, j) => {
    const lo = Math.min(i, j)
    const hi = Math.max(i, j)
    return a.times(us[lo]!).minus(sinh[lo]!.div(grow[hi]!))
  }))
  // right side m_i e^{omega u_i} - 1 = e^{ln P_i + omega u_i} - 1
  const rhs = us.map((v, i) => exp(new S(lnP[i]!).plus(w.times(v))).minus(1))
  let b: Dec[]
  try {
    b = solveSymmetric(H, rhs)
  }
  catch {
    throw new EngineError('calibration-failed', `The Smith-Wilson system has no unique solution for alpha = ${a.toString()}; check for repeated terms.`)
  }
  const pieces: WilsonPiece[] = []
  for (let k = 0; k <= us.length; k += 1) {
    let A = new S(1)
    let B = new S(0)
    let C = new S(0)
    let D = new S(0)
    us.forEach((v, j) => {
      if (j < k) {
        // u_j <= t: b_j (alpha u_j - e^{-alpha t} sinh(alpha u_j))
        A = A.plus(b[j]!.times(a).times(v))
        C = C.minus(b[j]!.times(sinh[j]!))
      }
      else {
        // u_j > t: b_j (alpha t - e^{-alpha u_j} sinh(alpha t))
        B = B.plus(b[j]!.times(a))
        D = D.minus(b[j]!.div(grow[j]!))
      }
    })
    pieces.push({ A, B, C, D })
  }
  return { omega: w, alpha: a, u: us, b, pieces }
}

/** The piece holding t: the last k with u_k <= t (u_0 = 0), by bisection. */
function pieceAt(fit: WilsonFit, t: Dec): WilsonPiece {
  let lo = 0
  let hi = fit.u.length
  while (lo < hi) {
    const mid = (lo + hi + 1) >> 1
    if (fit.u[mid - 1]!.lte(t)) lo = mid
    else hi = mid - 1
  }
  return fit.pieces[lo]!
}

/** The fit's numbers rounded into another context (evaluation runs at the working precision, the solve above it). */
export function inContext(fit: WilsonFit, D: DecimalCtor): WilsonFit {
  const r = (v: Dec) => new D(roundTo(v, D.precision))
  return {
    omega: r(fit.omega),
    alpha: r(fit.alpha),
    u: fit.u.map(r),
    b: fit.b.map(r),
    pieces: fit.pieces.map(p => ({ A: r(p.A), B: r(p.B), C: r(p.C), D: r(p.D) })),
  }
}

/** e^{-alpha t} and sinh(alpha t), and the piece holding t. */
function parts(fit: WilsonFit, t: Dec): { p: WilsonPiece, e: Dec, down: Dec, sinh: Dec } {
  const e = exp(fit.alpha.times(t))
  const down = new (t.constructor as DecimalCtor)(1).div(e)
  return { p: pieceAt(fit, t), e, down, sinh: e.minus(down).div(2) }
}

/** G(t) = A + B t + C e^{-alpha t} + D sinh(alpha t), in the fit's decimal context (t in the same one). */
export function wilsonValue(fit: WilsonFit, t: Dec): Dec {
  const { p, down, sinh } = parts(fit, t)
  return p.A.plus(p.B.times(t)).plus(p.C.times(down)).plus(p.D.times(sinh))
}

/** G(t), G'(t) and G''(t): G' = B - alpha C e^{-alpha t} + alpha D cosh(alpha t), G'' = alpha^2 (C e^{-alpha t} + D sinh(alpha t)). */
export function wilsonG(fit: WilsonFit, t: Dec): { G: Dec, G1: Dec, G2: Dec } {
  const { p, e, down, sinh } = parts(fit, t)
  const a = fit.alpha
  const curve = p.C.times(down).plus(p.D.times(sinh))
  const G = p.A.plus(p.B.times(t)).plus(curve)
  const G1 = p.B.minus(a.times(p.C).times(down)).plus(a.times(p.D).times(e.plus(down).div(2)))
  return { G, G1, G2: a.times(a).times(curve) }
}

/** Forward intensity f(t) = -d ln P/dt = omega - G'(t)/G(t). */
export function forwardIntensity(fit: WilsonFit, t: Dec): Dec {
  const { G, G1 } = wilsonG(fit, t)
  return fit.omega.minus(G1.div(G))
}

/** ln P(t) = -omega t + ln G(t), rounded to `digits`. Refuses a t where the fitted discount factor is not positive. */
export function wilsonLnP(fit: WilsonFit, t: Dec, digits: number): Dec {
  const G = wilsonValue(fit, t)
  if (!G.gt(0)) {
    throw new EngineError('transform-domain', `The Smith-Wilson curve through these points has a discount factor of zero or below at t = ${t.toString()}, so no spot rate exists there; the given rates change too sharply between close terms for this alpha (try a larger alpha or another method).`)
  }
  return roundTo(ln(G).minus(fit.omega.times(t)), digits)
}
