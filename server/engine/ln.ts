import { decimalContext, exp, roundTo, type Dec, type DecimalCtor } from './decimal'
import { ELEMENTARY_GUARD_DIGITS } from './precision'

const ENOUGH = new Map<DecimalCtor, Dec>()

/** The error after a step is about half the square of its correction: stop once that is below 10^-(W - 2). */
function enoughFor(W: DecimalCtor): Dec {
  let v = ENOUGH.get(W)
  if (!v) ENOUGH.set(W, v = new W(`1e-${Math.ceil((W.precision - 2) / 2)}`))
  return v
}

/**
 * ln x (x > 0) to the precision of x's context, by Newton's method on e^y = x: y <- y + x e^{-y} - 1, quadratic convergence
 * from the binary floating-point logarithm (about 16 digits), so 2 steps at 50 digits, 4 at 200 (Muller, Elementary Functions,
 * 3rd ed., 2016, ch. 5, Newton-Raphson iteration for the logarithm). Each step costs one of the engine's fast exps
 * (decimal.ts), several times less than decimal.js's ln. The iteration runs at ELEMENTARY_GUARD_DIGITS (precision.ts) more digits, plus as many as x - 1 has
 * leading zeros, so the result is accurate relative to ln x even next to x = 1; it is then rounded once. Deterministic.
 */
export function ln(x: Dec): Dec {
  const D = x.constructor as DecimalCtor
  const digits = D.precision
  const near = x.minus(1)
  if (near.isZero()) return near
  const start = Math.log(x.toNumber())
  if (!Number.isFinite(start) || x.lte(0)) return x.ln() // outside the float range (or not positive: decimal.js says NaN)
  const W = decimalContext(digits + ELEMENTARY_GUARD_DIGITS + Math.max(0, -near.e - 1))
  const X = new W(x)
  const enough = enoughFor(W)
  let y = new W(start)
  for (let step = 0; step < 12; step += 1) {
    const correction = X.times(exp(y.neg())).minus(1)
    y = y.plus(correction)
    if (correction.abs().lte(enough)) break
  }
  return roundTo(new D(y), digits)
}
