import { roundTo, sign, type Dec } from './decimal'
import { bumpReach } from './bump'
import { intensityOf, rateInDomain, rateOfIntensityExact } from './compounding'
import { evaluateValues, type CoreFill } from './pipeline'
import { hornerDerivative, type PiecewisePolynomial } from './piecewise'
import { FLOAT_TINY, UNIT_ROUNDOFF as u } from './precision'
import type { Compounding, CurvatureReport, Diagnostics, ForwardReport, Located, MonotonicityReport, RangeReport, Span, TableKind } from './types'

const LIST_LIMIT = 20

/** Shape, range and curve checks of a fill (docs/domain.md#checks). Kept out of the timed fit-and-evaluate path. */
export function computeDiagnostics(core: CoreFill): Diagnostics {
  const order = ascendingOrder(core)
  const xs = order.map(k => core.points.xs[k]!)
  const ys = order.map(k => core.values[k]!)
  const deviation = knotDeviation(core)
  const P = core.spec.precision
  return {
    maxKnotDeviation: deviation.value.toString(),
    maxKnotDeviationAt: deviation.at,
    knotsReproduced: deviation.value.isZero(),
    curvatureSignChanges: curvature(core.pp, P),
    roughness: roughness(ys, P),
    monotonicity: monotonicity(core.knots.y, xs, ys),
    outOfRange: outOfRange(core.spec.kind, xs, ys),
    forwards: core.spec.kind === 'spot-rate' || core.spec.kind === 'discount-factor' ? forwards(core.spec.kind, xs, ys, P, core.spec.compounding ?? 'annual') : null,
    closure: core.closure?.report ?? null,
    bump: bumpReach(core),
    ...(core.pp.closedForm?.convergence ? { convergence: core.pp.closedForm.convergence() } : {}),
    notes: [...core.notes, ...(core.def.notes?.(core.knots.x, xs) ?? []), ...extrapolationNotes(core)],
  }
}

function ascendingOrder(core: CoreFill): number[] {
  const idx = core.points.xs.map((_, k) => k)
  if (core.points.ascending) return idx
  return idx.sort((a, b) => core.points.xs[a]!.cmp(core.points.xs[b]!))
}

/** Each knot re-evaluated through the same path as the output (sweep, inverse transform, rounding), against the given y rounded alike. */
function knotDeviation(core: CoreFill): { value: Dec, at: string | null } {
  const again = evaluateValues(core, core.knots.x, true)
  let worst = core.knots.x[0]!.times(0)
  let at: string | null = null
  again.forEach((v, i) => {
    const d = v.minus(roundTo(core.knots.y[i]!, core.spec.precision)).abs()
    if (d.gt(worst)) {
      worst = d
      at = core.knots.x[i]!.toString()
    }
  })
  return { value: worst, at }
}

/**
 * Sign changes of the second derivative of the fitted pieces, read at both ends of every piece (on the method's scale,
 * i.e. after the transform). A change inside a piece is reported as the span between its knots; a jump across zero at a
 * knot (quadratic spline, Hermite cubics) as that knot. Values below a noise floor of 10^-precision * max|y| / min(h)^2 count as zero.
 */
function curvature(pp: PiecewisePolynomial, precision: number): CurvatureReport {
  const samples: { x: Dec, value: Dec }[] = []
  let yMax = pp.endValue.abs()
  let hMin = pp.breaks[1]!.minus(pp.breaks[0]!)
  pp.coefs.forEach((c, i) => {
    const h = pp.breaks[i + 1]!.minus(pp.breaks[i]!)
    if (h.lt(hMin)) hMin = h
    if (c[0]!.abs().gt(yMax)) yMax = c[0]!.abs()
    samples.push({ x: pp.breaks[i]!, value: hornerDerivative(c, h.times(0), 2) })
    samples.push({ x: pp.breaks[i + 1]!, value: hornerDerivative(c, h, 2) })
  })
  const closed = pp.closedForm
  if (closed) {
    // a closed form (twice differentiable) is read at every knot
    pp.breaks.forEach((x, i) => {
      if (i > 0 && x.minus(pp.breaks[i - 1]!).lt(hMin)) hMin = x.minus(pp.breaks[i - 1]!)
      samples.push({ x, value: closed.derivative(x, 2) })
    })
  }
  const floor = yMax.div(hMin).div(hMin).times(`1e-${precision}`)
  const at: Span[] = []
  let prev: { x: Dec, s: number } | null = null
  for (const sample of samples) {
    if (sample.value.abs().lte(floor)) continue
    const s = sign(sample.value)
    if (prev && s !== prev.s) at.push({ from: prev.x.toString(), to: sample.x.toString() })
    prev = { x: sample.x, s }
  }
  return {
    basis: closed
      ? 'second derivative of the fitted closed form at every knot, on the interpolated (transformed) scale'
      : 'second derivative of the fitted pieces at both ends of each piece, on the interpolated (transformed) scale',
    count: at.length,
    at: at.slice(0, LIST_LIMIT),
  }
}

/** Sums of squared second and third differences of the filled values in x order (Whittaker 1923 smoothness measure). */
function roughness(ys: Dec[], precision: number): Diagnostics['roughness'] {
  const zero = ys[0]!.times(0)
  const d1: Dec[] = []
  for (let k = 1; k < ys.length; k += 1) d1.push(ys[k]!.minus(ys[k - 1]!))
  const d2: Dec[] = []
  for (let k = 1; k < d1.length; k += 1) d2.push(d1[k]!.minus(d1[k - 1]!))
  let s2 = zero
  let s3 = zero
  d2.forEach((d, k) => {
    s2 = s2.plus(d.times(d))
    if (k > 0) {
      const t = d.minus(d2[k - 1]!)
      s3 = s3.plus(t.times(t))
    }
  })
  return {
    secondDifferences: roundTo(s2, precision).toString(),
    thirdDifferences: roundTo(s3, precision).toString(),
    basis: 'plain differences of consecutive filled values in x order (uneven spacing is not rescaled)',
  }
}

function turningPoints(ys: Dec[]): number[] {
  const out: number[] = []
  let prev = 0
  for (let k = 1; k < ys.length; k += 1) {
    const s = sign(ys[k]!.minus(ys[k - 1]!))
    if (s === 0) continue
    if (prev !== 0 && s !== prev) out.push(k - 1)
    prev = s
  }
  return out
}

function monotonicity(knotY: Dec[], xs: Dec[], ys: Dec[]): MonotonicityReport {
  const knotTurns = turningPoints(knotY)
  const signs = new Set<number>()
  for (let i = 1; i < knotY.length; i += 1) signs.add(sign(knotY[i]!.minus(knotY[i - 1]!)))
  signs.delete(0)
  const knotDirection = signs.size === 0 ? 'constant' : signs.size === 2 ? 'mixed' : signs.has(1) ? 'increasing' : 'decreasing'
  const fillTurns = turningPoints(ys)
  return {
    knotDirection,
    knotTurningPoints: knotTurns.length,
    fillTurningPoints: fillTurns.length,
    at: fillTurns.slice(0, LIST_LIMIT).map(k => xs[k]!.toString()),
  }
}

const RANGE_RULES: Partial<Record<TableKind, { rule: string, bad: (y: Dec) => boolean }>> = {
  'mortality': { rule: '0 <= q <= 1', bad: y => y.lt(0) || y.gt(1) },
  'lapse': { rule: '0 <= rate <= 1', bad: y => y.lt(0) || y.gt(1) },
  'spot-rate': { rule: 'spot rate >= 0 (negative rates flagged) and > -1', bad: y => y.lt(0) },
  'discount-factor': { rule: '0 < P <= 1 (P > 1 means a negative rate)', bad: y => y.lte(0) || y.gt(1) },
  'salary': { rule: 'salary scale > 0', bad: y => y.lte(0) },
}

function outOfRange(kind: TableKind, xs: Dec[], ys: Dec[]): RangeReport {
  const rule = RANGE_RULES[kind]
  if (!rule) return { rule: 'no range rule for kind other', count: 0, first: [] }
  const first: Located[] = []
  let count = 0
  ys.forEach((y, k) => {
    if (!rule.bad(y)) return
    count += 1
    if (first.length < LIST_LIMIT) first.push({ x: xs[k]!.toString(), value: y.toString() })
  })
  return { rule: rule.rule, count, first }
}

/**
 * Forward rates between consecutive points: F = (ln P(t1) - ln P(t2)) / (t2 - t1) (continuous), reported under the curve's
 * compounding (annual f = exp(F) - 1; Hull, Options, Futures and Other Derivatives, ch. 4). ln P = -t intensity(r) for spot
 * rates (compounding.ts), ln P for discount factors. A decimal ln costs ~0.1 ms at 50 digits, so the scan over every pair
 * runs in binary floating point only to rank and locate (minimum, largest jump); every figure reported is computed again in
 * decimal, and so is the sign of any forward whose float value lies within its error bound (floatDoubt) of zero.
 */
function forwards(kind: TableKind, xs: Dec[], ys: Dec[], precision: number, c: Compounding): ForwardReport {
  const convention = `${c} compounding between consecutive filled points; located on continuously compounded forwards`
  const exactLnP = (k: number): Dec | null => {
    const t = xs[k]!
    const y = ys[k]!
    // ln P = -t intensity(r) for spot rates under c (compounding.ts), ln P for discount factors
    if (kind === 'spot-rate') return t.isZero() ? t : rateInDomain(y, c) ? intensityOf(y, c).times(t).neg() : null
    return y.gt(0) ? y.ln() : null
  }
  const rough = ys.map((y, k) => roughLogDiscount(kind, xs[k]!.toNumber(), y.toNumber(), c))
  const fwd: { rough: number, doubt: number, k: number }[] = [] // pair (k-1, k)
  for (let k = 1; k < xs.length; k += 1) {
    const a = rough[k - 1]!
    const b = rough[k]!
    const dt = xs[k]!.minus(xs[k - 1]!)
    if (a.value === null || b.value === null || dt.isZero()) continue
    const F = (a.value - b.value) / dt.toNumber()
    fwd.push({ rough: F, doubt: floatDoubt(a.error + b.error, dt.toNumber(), F), k })
  }
  if (fwd.length === 0) return { convention, minimum: null, negativeCount: 0, negatives: [], largestJump: null }
  const exactF = (k: number): Dec => exactLnP(k - 1)!.minus(exactLnP(k)!).div(xs[k]!.minus(xs[k - 1]!))
  const quoted = (F: Dec) => roundTo(rateOfIntensityExact(F, c), precision).toString()
  let min = fwd[0]!
  const negatives: Span[] = []
  let negativeCount = 0
  let jumpAt = -1
  let jumpSize = -1
  fwd.forEach((f, i) => {
    if (f.rough < min.rough) min = f
    const negative = Math.abs(f.rough) > f.doubt ? f.rough < 0 : exactF(f.k).isNegative() && !exactF(f.k).isZero()
    if (negative) {
      negativeCount += 1
      if (negatives.length < LIST_LIMIT) negatives.push({ from: xs[f.k - 1]!.toString(), to: xs[f.k]!.toString() })
    }
    if (i > 0) {
      const size = Math.abs(f.rough - fwd[i - 1]!.rough)
      if (size > jumpSize) { jumpSize = size; jumpAt = i }
    }
  })
  let largestJump: ForwardReport['largestJump'] = null
  if (jumpAt > 0) {
    const before = exactF(fwd[jumpAt - 1]!.k)
    const after = exactF(fwd[jumpAt]!.k)
    largestJump = { value: roundTo(rateOfIntensityExact(after, c).minus(rateOfIntensityExact(before, c)), precision).toString(), at: xs[fwd[jumpAt]!.k - 1]!.toString() }
  }
  return {
    convention,
    minimum: { value: quoted(exactF(min.k)), from: xs[min.k - 1]!.toString(), to: xs[min.k]!.toString() },
    negativeCount,
    negatives,
    largestJump,
  }
}

/**
 * ln P(t) in binary floating point with a bound on its absolute error, under the standard model (precision.ts: each
 * conversion and operation within u, log and log1p within 2u). Spot rate r, annual: L = -t log1p(r); converting r costs
 * |r|/(1 + r) u in log1p(r) (its derivative is 1/(1 + r)), log1p itself 2u |log1p r|, t and the product 2u |L|.
 * Semi-annual: L = -2t log1p(r/2) (r/2 exact): converting r costs |r|/(2 + r) u in log1p, times 2t. Continuous: L = -t r,
 * the conversions and the product 3u |L|. Discount factor P: L = ln P; converting P costs u (d ln P = dP/P), the log
 * 2u |L|. Doubled for headroom.
 */
function roughLogDiscount(kind: TableKind, t: number, v: number, c: Compounding): { value: number | null, error: number } {
  if (kind === 'spot-rate') {
    if (t === 0) return { value: 0, error: 0 }
    if (c === 'continuous') {
      const L = -t * v
      return { value: L, error: 2 * u * 3 * Math.abs(L) + FLOAT_TINY }
    }
    if (c === 'semi-annual') {
      if (!(v > -2)) return { value: null, error: 0 }
      const L = -2 * t * Math.log1p(v / 2)
      return { value: L, error: 2 * u * (2 * Math.abs(t) * Math.abs(v) / (2 + v) + 4 * Math.abs(L)) + FLOAT_TINY }
    }
    if (!(v > -1)) return { value: null, error: 0 }
    const L = -t * Math.log1p(v)
    return { value: L, error: 2 * u * (Math.abs(t) * Math.abs(v) / (1 + v) + 4 * Math.abs(L)) + FLOAT_TINY }
  }
  if (!(v > 0)) return { value: null, error: 0 }
  const L = Math.log(v)
  return { value: L, error: 2 * u * (1 + 2 * Math.abs(L)) + FLOAT_TINY }
}

/**
 * Bound on |F_float - F| for F = (L_a - L_b) / dt: the two ln P errors over dt, plus the subtraction, the conversion of dt
 * and the division (3u |F|), doubled for headroom (Higham 2002, 2.2, first-order terms; the second-order ones are below u^2).
 */
function floatDoubt(lnPErrors: number, dt: number, F: number): number {
  return 2 * (lnPErrors / dt + 3 * u * Math.abs(F)) + FLOAT_TINY
}

/** How the fill goes on outside the given points, in words (the rule's id kept where a reader may look it up). */
const EXTRAPOLATION_WORDS: Partial<Record<string, string>> = {
  flat: 'the end value held flat',
  linear: 'the end piece extended as a straight line',
  gompertz: "closed at old ages by a Gompertz law fitted to the oldest given ages (rule 'gompertz')",
  kannisto: "closed at old ages by a Kannisto law fitted to the oldest given ages (rule 'kannisto')",
  method: "carried on by the method's own formula (rule 'method')",
}

function extrapolationNotes(core: CoreFill): string[] {
  const lo = core.pp.breaks[0]!
  const hi = core.pp.breaks[core.pp.breaks.length - 1]!
  let below = 0
  let above = 0
  for (const x of core.points.xs) {
    if (x.lt(lo)) below += 1
    else if (x.gt(hi)) above += 1
  }
  if (below + above === 0) return []
  const rule = EXTRAPOLATION_WORDS[core.spec.extrapolation] ?? `extended by rule '${core.spec.extrapolation}'`
  return [`${below + above} point(s) lie outside the given points, ${lo.toString()} to ${hi.toString()} (${below} below, ${above} above); there the fill is ${rule}.`]
}
