import { describeFailure, parseDecimal, quote, type Dec, type DecimalCtor } from './decimal'
import { EngineError } from './errors'
import type { UniformGrid } from './evaluate'
import type { GridSpec } from './types'

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
 * The output abscissae: a regular grid from, from + step, ... up to and including `to` when it is reached,
 * built by repeated exact decimal addition of the step; or an explicit list `at` (any order, repeats allowed).
 */
// compare() fills the same points with several methods: keep the last resolution (Decimals are immutable).
let lastKey = ''
let lastCtor: DecimalCtor | null = null
let lastPoints: ResolvedPoints | null = null

export function resolvePoints(D: DecimalCtor, grid: unknown, at: unknown): ResolvedPoints {
  const key = memoKey(grid, at)
  if (key !== null && lastCtor === D && lastKey === key && lastPoints) return lastPoints
  const points = resolveFresh(D, grid, at)
  if (key !== null) {
    lastKey = key
    lastCtor = D
    lastPoints = points
  }
  return points
}

const NUMBER_TEXT = /^[-+]?[0-9.eE+-]+$/

/** Drops the kept resolution (benchmarks time a cold grid with it). */
export function forgetResolvedPoints(): void {
  lastKey = ''
  lastCtor = null
  lastPoints = null
}

function memoKey(grid: unknown, at: unknown): string | null {
  if (grid && typeof grid === 'object' && (at === undefined || at === null)) {
    const g = grid as Record<string, unknown>
    return typeof g.from === 'string' && typeof g.to === 'string' && typeof g.step === 'string' ? `g|${g.from}|${g.to}|${g.step}` : null
  }
  // only plain number text takes part, so two different lists can never share a key
  if ((grid === undefined || grid === null) && Array.isArray(at) && at.every(v => typeof v === 'string' && NUMBER_TEXT.test(v))) return `a|${at.join(',')}`
  return null
}

function resolveFresh(D: DecimalCtor, grid: unknown, at: unknown): ResolvedPoints {
  if ((grid === undefined || grid === null) === (at === undefined || at === null)) {
    throw new EngineError('invalid-grid', 'Give either a grid {from, to, step} or a list of points (at), not both and not neither.')
  }
  if (grid !== undefined && grid !== null) {
    if (typeof grid !== 'object') throw new EngineError('invalid-grid', 'The grid must be {from, to, step}.')
    const g = grid as Record<string, unknown>
    const from = parseField(D, g.from, 'from')
    const to = parseField(D, g.to, 'to')
    const step = parseField(D, g.step, 'step')
    if (!step.gt(0)) throw new EngineError('invalid-grid', `Grid step must be greater than 0; it is ${step.toString()}.`)
    if (to.lt(from)) throw new EngineError('invalid-grid', `Grid 'to' (${to.toString()}) is below 'from' (${from.toString()}).`)
    const count = to.minus(from).div(step).floor().plus(1)
    if (count.gt(MAX_POINTS)) {
      throw new EngineError('invalid-grid', `The grid has ${count.toString()} points; at most ${MAX_POINTS} are allowed. Use a larger step.`)
    }
    const n = count.toNumber()
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
