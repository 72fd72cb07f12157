import { roundTo, type Dec, type DecimalCtor } from './decimal'
import { EngineError } from './errors'
import { fillAt } from './fill'
import { resolvePoints, type ResolvedPoints } from './grid'
import { FLOAT_TINY, UNIT_ROUNDOFF, resolvePrecision, workingContext } from './precision'
import type { CompareEntry, CompareResult, FillRequest, FillResult, MethodSpec, MoneyDifference, PairDifference } from './types'

const MAX_METHODS = 12

function defaultLabel(spec: MethodSpec, request: FillRequest): string {
  const parts: string[] = [spec.method]
  const opts = Object.entries(spec.options ?? {}).map(([k, v]) => `${k}=${v}`)
  if (opts.length) parts.push(`(${opts.join(', ')})`)
  const transform = spec.transform ?? request.transform
  if (transform && transform !== 'none') parts.push(`on ${transform}`)
  return parts.join(' ')
}

/**
 * Fill the same request with several methods and set the results side by side: the largest absolute difference of every pair
 * (and where), and every money figure against a baseline (default the first method), as absolute and percent differences.
 * A method that cannot fill the request is reported with its message instead of failing the whole comparison.
 */
export function compare(request: FillRequest, methods: MethodSpec[], options: CompareOptions = {}): CompareResult {
  const steps = compareSteps(request, methods, options)
  for (;;) {
    const step = steps.next()
    if (step.done) return step.value
  }
}

/**
 * The same comparison, awaiting `pause(methods filled so far, methods)` after each method's fill: a server can let other requests run between methods and
 * stop (by throwing from `pause`) when nobody waits for the answer any more. Same result as compare().
 */
export async function compareAsync(request: FillRequest, methods: MethodSpec[], options: CompareOptions, pause: (filled: number, of: number) => Promise<void>): Promise<CompareResult> {
  const steps = compareSteps(request, methods, options)
  for (let filled = 1; ; filled += 1) {
    const step = steps.next()
    if (step.done) return step.value
    await pause(filled, methods.length)
  }
}

export interface CompareOptions { baseline?: string }

/** compare() as steps: yields after each method's fill, returns the comparison. */
function* compareSteps(request: FillRequest, methods: MethodSpec[], options: CompareOptions): Generator<void, CompareResult> {
  if (!Array.isArray(methods) || methods.length === 0) throw new EngineError('invalid-request', 'Choose at least one method to compare.')
  if (methods.length > MAX_METHODS) throw new EngineError('invalid-request', `At most ${MAX_METHODS} methods can be compared at once.`)
  const shared = sharedPoints(request)
  const seen = new Map<string, number>()
  const entries: CompareEntry[] = []
  for (const spec of methods) {
    let label = spec.label ?? defaultLabel(spec, request)
    const n = (seen.get(label) ?? 0) + 1
    seen.set(label, n)
    if (n > 1) label = `${label} #${n}`
    try {
      const result = fillAt({ ...request, method: spec.method, options: spec.options ?? {}, transform: spec.transform ?? request.transform }, shared?.points)
      entries.push({ label, ok: true as const, result })
    }
    catch (error) {
      if (!(error instanceof EngineError)) throw error
      entries.push({ label, ok: false as const, error: error.message, code: error.code })
    }
    yield
  }
  const baselineLabel = options.baseline ?? entries[0]!.label
  const baseline = entries.find(e => e.label === baselineLabel || (e.ok && e.result.spec.method === baselineLabel))
  if (!baseline) throw new EngineError('invalid-request', `Baseline '${baselineLabel}' is not one of the compared methods.`)
  const done = entries.filter((e): e is CompareEntry & { ok: true } => e.ok)
  // every method ran at the request's precision: differences are taken at its working precision (precision.ts)
  const D = shared?.D ?? workingContext(done[0]?.result.spec.precision ?? resolvePrecision(undefined))
  const pairs: PairDifference[] = []
  const rough = done.map(e => Float64Array.from(e.result.points, p => Number(p.y)))
  for (let i = 0; i < done.length; i += 1) {
    for (let j = i + 1; j < done.length; j += 1) {
      pairs.push(pairDifference(D, { label: done[i]!.label, result: done[i]!.result, rough: rough[i]! }, { label: done[j]!.label, result: done[j]!.result, rough: rough[j]! }))
    }
  }
  const money = baseline.ok ? done.filter(e => e !== baseline).flatMap(e => moneyDifferences(D, baseline.result, e.label, e.result)) : []
  return { baseline: baseline.label, entries, pairs, money }
}

/**
 * The output points, resolved once for every method (they depend on the grid and the precision only). When the request's
 * grid or precision is refused, null: each method's fill then reports the refusal itself.
 */
function sharedPoints(request: FillRequest): { D: DecimalCtor, points: ResolvedPoints } | null {
  try {
    const D = workingContext(resolvePrecision(request?.precision))
    return { D, points: resolvePoints(D, request.grid, request.at) }
  }
  catch (error) {
    if (error instanceof EngineError) return null
    throw error
  }
}

interface Side { label: string, result: FillResult, rough: Float64Array }

// Bound on the error of |fl(a) - fl(b)| relative to |a| + |b|: two conversions and one subtraction, each within u (precision.ts),
// and one more u of headroom for the absolute value and the comparison.
const FLOAT_SLACK = 4 * UNIT_ROUNDOFF

/**
 * max_k |y_a(x_k) - y_b(x_k)| over the common output points, exactly. Binary floating point only shortlists:
 * every point whose float difference could, within its rounding bound, reach the largest one is compared in decimal.
 */
function pairDifference(D: DecimalCtor, a: Side, b: Side): PairDifference {
  const n = a.result.points.length
  const gap = (k: number) => Math.abs(a.rough[k]! - b.rough[k]!)
  const slack = (k: number) => FLOAT_SLACK * (Math.abs(a.rough[k]!) + Math.abs(b.rough[k]!)) + FLOAT_TINY
  // a lower bound on the true largest difference
  let floor = 0
  for (let k = 0; k < n; k += 1) {
    const low = gap(k) - slack(k)
    if (Number.isFinite(low) && low > floor) floor = low
  }
  let worst: Dec = new D(0)
  let at: string | null = null
  for (let k = 0; k < n; k += 1) {
    const high = gap(k) + slack(k)
    if (Number.isFinite(high) && high < floor) continue // cannot be the largest
    const d = new D(a.result.points[k]!.y).minus(new D(b.result.points[k]!.y)).abs()
    if (d.gt(worst)) {
      worst = d
      at = a.result.points[k]!.x
    }
  }
  return { a: a.label, b: b.label, maxAbsDifference: roundTo(worst, a.result.spec.precision).toString(), at }
}

/** value - baseline, and 100 (value - baseline) / baseline when the baseline is not zero. */
function moneyDifferences(D: DecimalCtor, base: FillResult, label: string, other: FillResult): MoneyDifference[] {
  const P = base.spec.precision
  return base.money.figures.map((figure) => {
    const match = other.money.figures.find(f => f.key === figure.key)
    const value = match?.value ?? null
    if (figure.value === null || value === null) {
      return { label, key: figure.key, baseline: figure.value, value, absolute: null, percent: null }
    }
    const diff = new D(value).minus(new D(figure.value))
    const b = new D(figure.value)
    return {
      label,
      key: figure.key,
      baseline: figure.value,
      value,
      absolute: roundTo(diff, P).toString(),
      percent: b.isZero() ? null : roundTo(diff.div(b).times(100), P).toString(),
    }
  })
}
