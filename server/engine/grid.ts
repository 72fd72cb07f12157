import { describeFailure, parseDecimal, quote, type Dec, type DecimalCtor } from './decimal'
import { EngineError } from './errors'
import type { UniformGrid } from './evaluate'
import { pow10, toScaled } from './exact'
import { FRACTION_STEP_PLACES, type GridSpec } from './types'

export const MAX_POINTS = 250_000

export interface ResolvedPoints {
  /** Points in output order. */
  xs: Dec[]
  grid: GridSpec | null
  at: string[] | null
  /** True when xs ascend (always for a grid). */
  ascending: boolean
  /** What a point is called in messages. */
  noun: string
  /** Set when every grid point is exactly from + k * step (no addition was rounded): the evaluator may step exactly. */
  uniform: UniformGrid | null
}

function parseField(D: DecimalCtor, raw: unknown, name: string): Dec {
  const parsed = parseDecimal(D, raw)
  if (!parsed.ok) throw new EngineError('invalid-grid', `Grid ${name} ${quote(raw)} ${describeFailure(parsed.reason)}.`)
  return parsed.value
}

/**
 * The output abscissae: a regular grid from, from + step, ... up to and including `to` when it is reached (a decimal step
 * by repeated exact decimal addition; a fraction step a/b by exact rational arithmetic, each point rounded to its places);
 * or an explicit list `at` (any order, repeats allowed). Nothing is kept between calls: compare() resolves once and
 * passes the result to each method's fill.
 */
export function resolvePoints(D: DecimalCtor, grid: unknown, at: unknown): ResolvedPoints {
  if ((grid === undefined || grid === null) === (at === undefined || at === null)) {
    throw new EngineError('invalid-grid', 'Give either a grid {from, to, step} or a list of points (at), not both and not neither.')
  }
  if (grid !== undefined && grid !== null) {
    if (typeof grid !== 'object') throw new EngineError('invalid-grid', 'The grid must be {from, to, step}.')
    const g = grid as Record<string, unknown>
    const from = parseField(D, g.from, 'from')
    const to = parseField(D, g.to, 'to')
    if (to.lt(from)) throw new EngineError('invalid-grid', `Grid 'to' (${to.toString()}) is below 'from' (${from.toString()}).`)
    if (typeof g.step === 'string' && g.step.includes('/')) return fractionGrid(D, from, to, g.step, g.places)
    if (g.places !== undefined && g.places !== null) throw new EngineError('invalid-grid', 'Grid places apply to a fraction step (like 1/12) only.')
    const step = parseField(D, g.step, 'step')
    if (!step.gt(0)) throw new EngineError('invalid-grid', `Grid step must be greater than 0; it is ${step.toString()}.`)
    const n = checkedCount(to.minus(from).div(step).floor().plus(1))
    const xs: Dec[] = new Array<Dec>(n)
    let x = from
    for (let k = 0; k < n; k += 1) {
      xs[k] = x
      x = x.plus(step)
    }
    return {
      xs,
      grid: { from: from.toString(), to: to.toString(), step: step.toString() },
      at: null,
      ascending: true,
      noun: 'Grid point',
      uniform: exactSteps(D, from, to, step) ? { from, step } : null,
    }
  }
  if (!Array.isArray(at)) throw new EngineError('invalid-grid', 'The list of points (at) must be an array of decimal strings.')
  if (at.length === 0) throw new EngineError('invalid-grid', 'The list of points (at) is empty.')
  if (at.length > MAX_POINTS) throw new EngineError('invalid-grid', `At most ${MAX_POINTS} points are allowed; ${at.length} were given.`)
  const xs = at.map((raw: unknown, k) => {
    const parsed = parseDecimal(D, raw)
    if (!parsed.ok) throw new EngineError('invalid-grid', `Requested point ${k + 1}: ${quote(raw)} ${describeFailure(parsed.reason)}.`)
    return parsed.value
  })
  let ascending = true
  for (let k = 1; k < xs.length && ascending; k += 1) ascending = xs[k - 1]!.lte(xs[k]!)
  return { xs, grid: null, at: xs.map(x => x.toString()), ascending, noun: 'Requested point', uniform: null }
}

/**
 * True when from + k * step is exact at the working precision for every point up to `to`: all points are multiples of
 * 10^-s (s = the decimal places of from and step) no larger in size than max(|from|, |to|), so they need at most
 * (integer digits) + s significant digits; if that fits the precision, no addition rounds.
 */
function exactSteps(D: DecimalCtor, from: Dec, to: Dec, step: Dec): boolean {
  const places = Math.max(from.decimalPlaces(), step.decimalPlaces())
  const largest = from.abs().gt(to.abs()) ? from.abs() : to.abs()
  const intDigits = largest.isZero() ? 0 : Math.max(largest.e + 1, 0)
  return intDigits + places <= D.precision
}

function checkedCount(count: Dec | bigint): number {
  if (typeof count === 'bigint' ? count > BigInt(MAX_POINTS) : count.gt(MAX_POINTS)) {
    throw new EngineError('invalid-grid', `The grid has ${count.toString()} points; at most ${MAX_POINTS} are allowed. Use a larger step.`)
  }
  return Number(count)
}

const FRACTION = /^\s*(\d{1,12})\s*\/\s*(\d{1,12})\s*$/
const MAX_PLACES = 40

/**
 * A grid of fraction step a/b (1/12: monthly terms in years): point k is from + k a/b, computed as an exact fraction
 * and rounded half-even to `places` decimals (default 12), so whole and half years stay exact and a saved fill
 * re-runs digit for digit from {from, to, step, places}. The points k = 0, 1, ... with from + k a/b <= to (exactly).
 * (Before engine 1.4.0 the server sent the same points as an explicit list; those saved specs still re-run as lists.)
 */
function fractionGrid(D: DecimalCtor, from: Dec, to: Dec, stepText: string, rawPlaces: unknown): ResolvedPoints {
  const m = FRACTION.exec(stepText)
  if (!m) throw new EngineError('invalid-grid', `Grid step ${quote(stepText)} is not a decimal or a fraction of two whole numbers like 1/12.`)
  const a = BigInt(m[1]!)
  const b = BigInt(m[2]!)
  if (a === 0n || b === 0n) throw new EngineError('invalid-grid', `Grid step ${quote(stepText)} must be greater than 0, with a denominator above 0.`)
  const places = rawPlaces === undefined || rawPlaces === null ? FRACTION_STEP_PLACES : rawPlaces
  if (typeof places !== 'number' || !Number.isInteger(places) || places < 0 || places > MAX_PLACES) {
    throw new EngineError('invalid-grid', `Grid places must be a whole number from 0 to ${MAX_PLACES}; got ${quote(places)}.`)
  }
  // a step below one unit of the last place would repeat points
  if (a * pow10(places) < b) throw new EngineError('invalid-grid', `Grid step ${a}/${b} is below 10^-${places}, the grid's last decimal place; use a larger step or more places.`)
  const s = Math.max(from.decimalPlaces(), to.decimalPlaces())
  const F = toScaled(from, s)
  const T = toScaled(to, s)
  if (F === null || T === null) throw new EngineError('invalid-grid', 'Grid from and to have too many digits for a fraction step.')
  const unit = pow10(s)
  // from + k a/b <= to  <=>  k <= (T - F) b / (a 10^s)
  const n = checkedCount((T - F) * b / (a * unit) + 1n)
  // x_k 10^places = (F b + k a 10^s) 10^places / (b 10^s), rounded half-even
  const den = b * unit
  const scale = pow10(places)
  const xs: Dec[] = new Array<Dec>(n)
  for (let k = 0; k < n; k += 1) {
    const num = (F * b + BigInt(k) * a * unit) * scale
    xs[k] = new D(`${roundHalfEven(num, den).toString()}e-${places}`)
  }
  return {
    xs,
    grid: { from: from.toString(), to: to.toString(), step: `${a}/${b}`, places },
    at: null,
    ascending: true,
    noun: 'Grid point',
    uniform: null,
  }
}

/** num / den (den > 0) rounded to the nearest integer, ties to even. */
function roundHalfEven(num: bigint, den: bigint): bigint {
  let q = num / den
  let r = num % den
  if (r < 0n) { q -= 1n; r += den }
  const twice = 2n * r
  if (twice > den || (twice === den && q % 2n !== 0n)) q += 1n
  return q
}
