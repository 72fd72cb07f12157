import { describeFailure, parseDecimal, quote, type Dec, type DecimalCtor } from './decimal'
import { EngineError } from './errors'
import type { UniformGrid } from './evaluate'
import { MAX_POINTS, resolvePoints } from './grid'
import type { AxisPoints, ExtrapolationRule } from './types'

const MAX_KNOTS_2D = 100_000

/** Given values of a two-way table as a full rectangular grid: values[i][j] at (xs[i], ds[j]). */
export interface KnotGrid { xs: Dec[], ds: Dec[], values: Dec[][] }

/** Parse the knots and check they fill a rectangular grid: every x with every d, exactly once. */
export function parseKnotGrid(D: DecimalCtor, knots: unknown): KnotGrid {
  if (!Array.isArray(knots) || knots.length === 0) throw new EngineError('invalid-request', 'Knots must be a non-empty list of {x, d, y} points.')
  if (knots.length > MAX_KNOTS_2D) throw new EngineError('invalid-request', `At most ${MAX_KNOTS_2D} knots are accepted; ${knots.length} were given.`)
  const cells = new Map<string, { y: Dec, position: number }>()
  const xs = new Map<string, Dec>()
  const ds = new Map<string, Dec>()
  knots.forEach((knot: unknown, index) => {
    const position = index + 1
    if (typeof knot !== 'object' || knot === null) throw new EngineError('invalid-knot', `Point ${position} is not an {x, d, y} triple.`, position)
    const raw = knot as Record<string, unknown>
    const v = (name: 'x' | 'd' | 'y') => {
      const parsed = parseDecimal(D, raw[name])
      if (!parsed.ok) throw new EngineError('invalid-knot', `Point ${position}: ${name} ${quote(raw[name])} ${describeFailure(parsed.reason)}.`, position)
      return parsed.value
    }
    const x = v('x')
    const d = v('d')
    const key = `${x.toString()}|${d.toString()}`
    const twin = cells.get(key)
    if (twin) throw new EngineError('duplicate-x', `Points ${twin.position} and ${position} both give x = ${x.toString()}, d = ${d.toString()}; each pair may appear once.`, position)
    cells.set(key, { y: v('y'), position })
    xs.set(x.toString(), x)
    ds.set(d.toString(), d)
  })
  const X = [...xs.values()].sort((a, b) => a.cmp(b))
  const Dd = [...ds.values()].sort((a, b) => a.cmp(b))
  const values = X.map(x => Dd.map((d) => {
    const cell = cells.get(`${x.toString()}|${d.toString()}`)
    if (!cell) {
      throw new EngineError('invalid-knot', `The knots do not fill a rectangular grid: there is no value at x = ${x.toString()}, d = ${d.toString()} `
        + `(${X.length} values of x and ${Dd.length} of d need ${X.length * Dd.length} points; ${knots.length} were given).`)
    }
    return cell.y
  }))
  return { xs: X, ds: Dd, values }
}

/** One axis of the output: the distinct points, ascending (with the uniform step when they come from a grid). */
export interface AxisOutput { points: Dec[], uniform: UniformGrid | null, spec: AxisPoints }

/** An axis's output points from a grid {from, to, step} or a list of decimal strings. */
export function resolveAxis(D: DecimalCtor, raw: unknown, name: 'x' | 'd'): AxisOutput {
  try {
    if (Array.isArray(raw)) {
      const r = resolvePoints(D, null, raw)
      const distinct = [...new Map(r.xs.map(v => [v.toString(), v])).values()].sort((a, b) => a.cmp(b))
      return { points: distinct, uniform: null, spec: r.at! }
    }
    const r = resolvePoints(D, raw, null)
    return { points: r.xs, uniform: r.uniform, spec: r.grid! }
  }
  catch (error) {
    if (error instanceof EngineError) throw new EngineError(error.code, `Axis ${name}: ${error.message}`)
    throw error
  }
}

/** The output pairs of an `at` list, parsed; at most MAX_POINTS. */
export function parsePairs(D: DecimalCtor, at: unknown): { x: Dec, d: Dec }[] {
  if (!Array.isArray(at) || at.length === 0) throw new EngineError('invalid-grid', 'The list of points (at) must be a non-empty list of {x, d} pairs.')
  if (at.length > MAX_POINTS) throw new EngineError('invalid-grid', `At most ${MAX_POINTS} points are allowed; ${at.length} were given.`)
  return at.map((pair: unknown, k) => {
    const raw = (typeof pair === 'object' && pair !== null ? pair : {}) as Record<string, unknown>
    const v = (name: 'x' | 'd') => {
      const parsed = parseDecimal(D, raw[name])
      if (!parsed.ok) throw new EngineError('invalid-grid', `Requested point ${k + 1}: ${name} ${quote(raw[name])} ${describeFailure(parsed.reason)}.`)
      return parsed.value
    }
    return { x: v('x'), d: v('d') }
  })
}

/** With 'error', refuse the first output point outside the given values of an axis, naming the axis. */
export function assertAxisInside(given: Dec[], points: Dec[], rule: ExtrapolationRule, name: 'x' | 'd'): void {
  if (rule !== 'error') return
  const lo = given[0]!
  const hi = given[given.length - 1]!
  const out = points.find(p => p.lt(lo) || p.gt(hi))
  if (out) {
    throw new EngineError('outside-knots', `${name} = ${out.toString()} lies outside the given ${name} [${lo.toString()}, ${hi.toString()}] and extrapolation is 'error'; choose 'flat' or 'linear' extrapolation, or keep the points inside.`)
  }
}
