import type { Dec } from './decimal'
import { EngineError } from './errors'
import { endSlopes, horner, type PiecewisePolynomial } from './piecewise'
import type { ExtrapolationRule } from './types'

/**
 * Check the extrapolation rule before any work: with 'error', name the first point (in the caller's order)
 * that lies outside [x_min, x_max].
 */
export function assertInside(pp: PiecewisePolynomial, xs: Dec[], rule: ExtrapolationRule, what: string, ascending = false): void {
  if (rule !== 'error' || xs.length === 0) return
  const lo = pp.breaks[0]!
  const hi = pp.breaks[pp.breaks.length - 1]!
  // ascending points: only the ends can be outside, so look at them before scanning
  if (ascending && xs[0]!.gte(lo) && xs[xs.length - 1]!.lte(hi)) return
  for (let k = 0; k < xs.length; k += 1) {
    const x = xs[k]!
    if (x.lt(lo) || x.gt(hi)) {
      throw new EngineError(
        'outside-knots',
        `${what} ${k + 1} (x = ${x.toString()}) lies outside the knots [${lo.toString()}, ${hi.toString()}] `
        + `and extrapolation is 'error'; choose 'flat' or 'linear' extrapolation, or keep the points inside the knots.`,
      )
    }
  }
}

/**
 * Evaluate at ascending points by one forward sweep over the pieces (no search per point).
 * Inside [x_0, x_n): the piece containing x, by Horner in local coordinates. At x_n: the last knot value.
 * Outside: 'flat' holds the end value, 'linear' continues the end piece's slope; 'error' must be checked before.
 */
export function evaluateAscending(pp: PiecewisePolynomial, xs: Dec[], rule: ExtrapolationRule): Dec[] {
  const out: Dec[] = new Array<Dec>(xs.length)
  const { breaks, coefs, endValue } = pp
  const last = coefs.length - 1
  const x0 = breaks[0]!
  const xn = breaks[last + 1]!
  const y0 = coefs[0]![0]!
  let slopes: { left: Dec, right: Dec } | null = null
  let i = 0
  let piece = coefs[0]!
  let start = x0
  let next = breaks[1]!
  let inside = false
  for (let k = 0; k < xs.length; k += 1) {
    const x = xs[k]!
    if (!inside && !(inside = x.gte(x0))) {
      out[k] = rule === 'linear' ? y0.plus((slopes ??= endSlopes(pp)).left.times(x.minus(x0))) : y0
      continue
    }
    while (i < last && x.gte(next)) {
      i += 1
      piece = coefs[i]!
      start = next
      next = breaks[i + 1]!
    }
    if (i === last && x.gte(xn)) {
      if (x.eq(xn) || rule !== 'linear') out[k] = endValue
      else out[k] = endValue.plus((slopes ??= endSlopes(pp)).right.times(x.minus(xn)))
      continue
    }
    out[k] = horner(piece, x.minus(start))
  }
  return out
}

/** Evaluate at points in any order: sort a permutation, sweep, put results back in the caller's order. */
export function evaluateAny(pp: PiecewisePolynomial, xs: Dec[], rule: ExtrapolationRule): Dec[] {
  let ascending = true
  for (let k = 1; k < xs.length && ascending; k += 1) ascending = xs[k - 1]!.lte(xs[k]!)
  if (ascending) return evaluateAscending(pp, xs, rule)
  const order = xs.map((_, k) => k).sort((a, b) => xs[a]!.cmp(xs[b]!))
  const sorted = evaluateAscending(pp, order.map(k => xs[k]!), rule)
  const out: Dec[] = new Array<Dec>(xs.length)
  order.forEach((k, j) => { out[k] = sorted[j]! })
  return out
}
