import { roundTo, type Dec, type DecimalCtor } from './decimal'
import { EngineError } from './errors'
import { commonScale, pow10, roundScaled, toScaled } from './exact'
import { endSlopes, horner, type PiecewisePolynomial } from './piecewise'
import { CLOSURE_RULES, type ExtrapolationRule } from './types'

/** A grid whose points are exactly from + k * step (every addition exact): evaluated by exact forward differences. */
export interface UniformGrid {
  from: Dec
  step: Dec
}

/**
 * Check the extrapolation rule before any work: with 'error', name the first point (in the caller's order)
 * that lies outside [x_min, x_max].
 */
export function assertInside(pp: PiecewisePolynomial, xs: Dec[], rule: ExtrapolationRule, what: string, ascending = false, advice = "choose 'flat' or 'linear' extrapolation"): void {
  // the closure rules (gompertz, kannisto) continue a table upward only: below the first knot they refuse like 'error'
  const closure = (CLOSURE_RULES as readonly string[]).includes(rule)
  if ((rule !== 'error' && !closure) || xs.length === 0) return
  const lo = pp.breaks[0]!
  const hi = closure ? null : pp.breaks[pp.breaks.length - 1]!
  // ascending points: only the ends can be outside, so look at them before scanning
  if (ascending && xs[0]!.gte(lo) && (!hi || xs[xs.length - 1]!.lte(hi))) return
  for (let k = 0; k < xs.length; k += 1) {
    const x = xs[k]!
    if (x.lt(lo) || (hi && x.gt(hi))) {
      throw new EngineError(
        'outside-knots',
        closure
          ? `${what} ${k + 1} (x = ${x.toString()}) lies below the first given age ${lo.toString()}; extrapolation '${rule}' closes the table at old ages only. Start the grid at ${lo.toString()}.`
          : `${what} ${k + 1} (x = ${x.toString()}) lies outside the knots [${lo.toString()}, ${hi!.toString()}] `
            + `and extrapolation is 'error'; ${advice}, or keep the points inside the knots.`,
      )
    }
  }
}

/** Piece i ready for exact evaluation: its start and its Horner constants as integers at one x scale. */
interface ExactPiece {
  start: bigint
  /** hornerConst[k] = c_k × 10^(cScale + (d - k) xScale), so v = (...(h_d T + h_{d-1}) T + ...) T + h_0 is exact. */
  hornerConst: bigint[]
  /** Scale of the integer value: value = v × 10^(-scale). */
  scale: number
}

function exactPiece(pp: PiecewisePolynomial, i: number, xScale: number): ExactPiece | null {
  const c = pp.coefs[i]!
  const cScale = commonScale(c)
  const start = toScaled(pp.breaks[i]!, xScale)
  if (cScale === null || start === null) return null
  const d = c.length - 1
  const hornerConst: bigint[] = []
  for (let k = 0; k <= d; k += 1) {
    const ck = toScaled(c[k]!, cScale)
    if (ck === null) return null
    hornerConst.push(ck * pow10((d - k) * xScale))
  }
  return { start, hornerConst, scale: cScale + d * xScale }
}

/** Exact value of the piece at X (an integer at the x scale), by Horner's rule on integers (no rounding). */
function exactValue(p: ExactPiece, X: bigint): bigint {
  const T = X - p.start
  const h = p.hornerConst
  let k = h.length - 1
  let v = h[k]!
  while (k > 0) {
    k -= 1
    v = v * T + h[k]!
  }
  return v
}

/**
 * The sweep's shared state: output, rounding, pieces prepared on first use, and the rule outside the knots
 * ('flat' holds the end value, 'linear' continues the end piece's slope; 'error' must be checked before).
 */
class Sweep {
  readonly out: Dec[]
  private readonly pieces: (ExactPiece | null | undefined)[]
  private slopes: { left: Dec, right: Dec } | null = null
  private readonly D: DecimalCtor

  constructor(readonly pp: PiecewisePolynomial, readonly xs: Dec[], readonly rule: ExtrapolationRule, readonly digits: number, readonly xScale: number | null) {
    this.out = new Array<Dec>(xs.length)
    this.pieces = new Array<ExactPiece | null | undefined>(pp.coefs.length)
    this.D = pp.breaks[0]!.constructor as DecimalCtor
  }

  piece(i: number): ExactPiece | null {
    let p = this.pieces[i]
    if (p === undefined) this.pieces[i] = p = this.xScale === null ? null : exactPiece(this.pp, i, this.xScale)
    return p
  }

  /** Point k outside [x_0, x_n), or exactly at x_n (the last knot's value, kept exactly). */
  outside(k: number): void {
    const { pp, rule } = this
    const x = this.xs[k]!
    const x0 = pp.breaks[0]!
    const xn = pp.breaks[pp.breaks.length - 1]!
    let v: Dec
    if (x.lt(x0)) {
      const y0 = pp.coefs[0]![0]!
      v = rule === 'linear' ? y0.plus((this.slopes ??= endSlopes(pp)).left.times(x.minus(x0))) : y0
    }
    else {
      v = x.eq(xn) || rule !== 'linear' ? pp.endValue : pp.endValue.plus((this.slopes ??= endSlopes(pp)).right.times(x.minus(xn)))
    }
    this.out[k] = roundTo(v, this.digits)
  }

  /** Point k inside piece i: exactly if the piece allows it, else by Horner in rounded decimal arithmetic. */
  inside(k: number, i: number, X: bigint | null): void {
    const p = X === null ? null : this.piece(i)
    if (p) this.emit(k, exactValue(p, X!), p)
    else this.out[k] = roundTo(horner(this.pp.coefs[i]!, this.xs[k]!.minus(this.pp.breaks[i]!)), this.digits)
  }

  emit(k: number, v: bigint, p: ExactPiece): void {
    this.out[k] = roundScaled(v, p.scale, this.digits, this.D)
  }
}

/**
 * Evaluate at ascending points by one forward sweep over the pieces (no search per point). Inside [x_0, x_n) the value is
 * the piece's polynomial evaluated exactly on scaled integers and rounded once, half-even, to `digits` significant digits.
 * On a uniform grid the points of a piece are reached by exact forward differences: d additions per point for degree d
 * (the d-th difference of a degree-d polynomial is constant; Knuth, TAOCP vol. 2, 4.6.4, "tabulating polynomial values").
 */
export function evaluateAscending(pp: PiecewisePolynomial, xs: Dec[], rule: ExtrapolationRule, digits: number, uniform: UniformGrid | null = null): Dec[] {
  if (uniform) {
    const xScale = maxScale(commonScale(pp.breaks), commonScale([uniform.from, uniform.step]))
    if (xScale !== null) return sweepUniform(new Sweep(pp, xs, rule, digits, xScale), uniform)
  }
  return sweepList(new Sweep(pp, xs, rule, digits, maxScale(commonScale(pp.breaks), commonScale(xs))))
}

function maxScale(a: number | null, b: number | null): number | null {
  return a === null || b === null ? null : Math.max(a, b)
}

function sweepList(s: Sweep): Dec[] {
  const { pp, xs, xScale } = s
  const last = pp.coefs.length - 1
  const x0 = pp.breaks[0]!
  const xn = pp.breaks[last + 1]!
  let i = 0
  let next = pp.breaks[1]!
  for (let k = 0; k < xs.length; k += 1) {
    const x = xs[k]!
    if (x.lt(x0) || x.gte(xn)) {
      s.outside(k)
      continue
    }
    while (i < last && x.gte(next)) next = pp.breaks[(i += 1) + 1]!
    s.inside(k, i, xScale === null ? null : toScaled(x, xScale))
  }
  return s.out
}

function sweepUniform(s: Sweep, grid: UniformGrid): Dec[] {
  const { pp, xs } = s
  const xScale = s.xScale!
  const n = xs.length
  const B = pp.breaks.map(b => toScaled(b, xScale)!)
  const H = toScaled(grid.step, xScale)!
  let X = toScaled(grid.from, xScale)!
  let k = 0
  for (; k < n && X < B[0]!; k += 1, X += H) s.outside(k)
  for (let i = 0; i < pp.coefs.length && k < n; i += 1) {
    const end = B[i + 1]!
    if (X >= end) continue
    // the points X, X + H, ... below the piece's end
    const m = Math.min(Number((end - X + H - 1n) / H), n - k)
    const p = s.piece(i)
    if (p) forwardRun(s, p, k, X, H, m)
    else for (let j = 0; j < m; j += 1) s.inside(k + j, i, null)
    k += m
    X += BigInt(m) * H
  }
  for (; k < n; k += 1) s.outside(k)
  return s.out
}

/** m points of piece p from X by step H: the first d + 1 by Horner, then a difference table advanced by additions. */
function forwardRun(s: Sweep, p: ExactPiece, k: number, X: bigint, H: bigint, m: number): void {
  const d = p.hornerConst.length - 1
  const table: bigint[] = []
  for (let j = 0; j <= d && j < m; j += 1) table.push(exactValue(p, X + BigInt(j) * H))
  if (m <= d + 1) {
    for (let j = 0; j < m; j += 1) s.emit(k + j, table[j]!, p)
    return
  }
  // table[j] becomes the j-th forward difference at X
  for (let order = 1; order <= d; order += 1) {
    for (let j = d; j >= order; j -= 1) table[j] = table[j]! - table[j - 1]!
  }
  for (let j = 0; j < m; j += 1) {
    s.emit(k + j, table[0]!, p)
    for (let q = 0; q < d; q += 1) table[q] = table[q]! + table[q + 1]!
  }
}

/** Evaluate at points in any order: sort a permutation, sweep, put results back in the caller's order. */
export function evaluateAny(pp: PiecewisePolynomial, xs: Dec[], rule: ExtrapolationRule, digits: number): Dec[] {
  let ascending = true
  for (let k = 1; k < xs.length && ascending; k += 1) ascending = xs[k - 1]!.lte(xs[k]!)
  if (ascending) return evaluateAscending(pp, xs, rule, digits)
  const order = xs.map((_, k) => k).sort((a, b) => xs[a]!.cmp(xs[b]!))
  const sorted = evaluateAscending(pp, order.map(k => xs[k]!), rule, digits)
  const out: Dec[] = new Array<Dec>(xs.length)
  order.forEach((k, j) => { out[k] = sorted[j]! })
  return out
}
