import { describeFailure, parseDecimal, quote, roundTo, type Dec, type DecimalCtor } from './decimal'
import { EngineError } from './errors'
import { evaluateAscending } from './evaluate'
import { resolvePrecision, workingContext, workingPrecision } from './precision'
import { methodDefinition } from './registry'
import { SPLIT_METHOD_IDS, type GroupTotal, type Located, type SplitMethodId, type SplitRequest, type SplitResult } from './types'
import { ENGINE_VERSION } from './version'

const MAX_GROUPS = 10_000
const LIST_LIMIT = 20

interface ParsedGroup { from: Dec, to: Dec, total: Dec, position: number }

function parseGroups(D: DecimalCtor, raw: unknown): { groups: ParsedGroup[], width: number } {
  if (!Array.isArray(raw) || raw.length === 0) throw new EngineError('invalid-group', 'Groups must be a non-empty list of {from, to, total}.')
  if (raw.length > MAX_GROUPS) throw new EngineError('invalid-group', `At most ${MAX_GROUPS} groups are accepted; ${raw.length} were given.`)
  const groups = raw.map((g: unknown, k): ParsedGroup => {
    const position = k + 1
    if (typeof g !== 'object' || g === null) throw new EngineError('invalid-group', `Group ${position} is not a {from, to, total} object.`, position)
    const field = (name: keyof GroupTotal) => {
      const value = (g as Record<string, unknown>)[name]
      const parsed = parseDecimal(D, value)
      if (!parsed.ok) throw new EngineError('invalid-group', `Group ${position}: ${name} ${quote(value)} ${describeFailure(parsed.reason)}.`, position)
      return parsed.value
    }
    const from = field('from')
    const to = field('to')
    if (!from.isInteger() || !to.isInteger() || !to.gt(from)) {
      throw new EngineError('invalid-group', `Group ${position} (${from.toString()} to ${to.toString()}): from and to must be whole numbers with to above from (55 to 59 is the band of ages 55, 56, 57, 58, 59).`, position)
    }
    return { from, to, total: field('total'), position }
  })
  groups.sort((a, b) => a.from.cmp(b.from))
  const width = groups[0]!.to.minus(groups[0]!.from).plus(1)
  for (let i = 1; i < groups.length; i += 1) {
    const [a, b] = [groups[i - 1]!, groups[i]!]
    if (!b.from.eq(a.to.plus(1))) {
      throw new EngineError('invalid-group', `Groups must follow each other without gap or overlap: group ${a.position} ends at ${a.to.toString()} but group ${b.position} starts at ${b.from.toString()}.`, b.position)
    }
    if (!b.to.minus(b.from).plus(1).eq(width)) {
      throw new EngineError('invalid-group', `Every group must have the same width: group ${groups[0]!.position} spans ${width.toString()} years, group ${b.position} (${b.from.toString()} to ${b.to.toString()}) spans ${b.to.minus(b.from).plus(1).toString()}.`, b.position)
    }
  }
  if (width.gt(1000)) throw new EngineError('invalid-group', `Groups of ${width.toString()} years are too wide; at most 1000.`)
  return { groups, width: width.toNumber() }
}

/**
 * Single-year values from group totals (deaths, exposures, population by 5-year band) with each group's total kept. The
 * cumulative totals Y_k at the group boundaries are pivotal values of the cumulative function; the method interpolates them at
 * every whole year, and the single-year values are the differences (the classical route to the published group multipliers:
 * Siegel and Swanson, The Methods and Materials of Demography, 2nd ed., 2004, App. C). Rounding: see roundToTotal.
 */
export function split(request: SplitRequest): SplitResult {
  if (typeof request !== 'object' || request === null) throw new EngineError('invalid-request', 'The request must be an object.')
  const method = request.method
  if (!(SPLIT_METHOD_IDS as readonly unknown[]).includes(method)) {
    throw new EngineError('unknown-method', `Method ${quote(method)} cannot split group totals; choose one of ${SPLIT_METHOD_IDS.join(', ')}.`)
  }
  const precision = resolvePrecision(request.precision)
  const D = workingContext(precision)
  const { groups, width } = parseGroups(D, request.groups)
  const def = methodDefinition(method)
  if (groups.length + 1 < def.minPoints) {
    throw new EngineError('too-few-points', `Method ${method} splits at least ${def.minPoints - 1} groups; ${groups.length} ${groups.length === 1 ? 'was' : 'were'} given.`)
  }
  if (method === 'beers' && width !== 5) {
    throw new EngineError('invalid-group', `Beers' coefficients are published for fifths only: it splits groups of 5 years, not ${width}. Use sprague or karup-king for groups of ${width}.`)
  }
  // Y_0 = 0 at the first boundary, Y_k = total of the first k groups
  const bounds = [groups[0]!.from, ...groups.map(g => g.to.plus(1))]
  const cumulative: Dec[] = [new D(0)]
  groups.forEach((g, k) => cumulative.push(cumulative[k]!.plus(g.total)))
  const pp = def.fit(bounds, cumulative, {}, D)
  const years: Dec[] = []
  for (let x = bounds[0]!; x.lte(bounds[bounds.length - 1]!); x = x.plus(1)) years.push(x)
  const Y = evaluateAscending(pp, years, 'error', workingPrecision(precision), { from: bounds[0]!, step: new D(1) })
  const points: { x: Dec, y: Dec }[] = []
  const adjustedAt: string[] = []
  let adjustedCount = 0
  let kept = true
  groups.forEach((g, k) => {
    const values = Array.from({ length: width }, (_, j) => Y[k * width + j + 1]!.minus(Y[k * width + j]!))
    const { rounded, adjusted, target } = roundToTotal(values, g.total, precision)
    adjusted.forEach((j) => { adjustedCount += 1; if (adjustedAt.length < LIST_LIMIT) adjustedAt.push(g.from.plus(j).toString()) })
    if (!rounded.reduce((s, v) => s.plus(v), new D(0)).eq(target)) kept = false
    rounded.forEach((y, j) => points.push({ x: g.from.plus(j), y }))
  })
  const negatives: Located[] = []
  let negativeCount = 0
  for (const p of points) {
    if (!p.y.isNegative() || p.y.isZero()) continue
    negativeCount += 1
    if (negatives.length < LIST_LIMIT) negatives.push({ x: p.x.toString(), value: p.y.toString() })
  }
  const notes = negativeCount ? [`${negativeCount} single-year value(s) are negative: the formula oscillates where the totals change sharply; a total of deaths or lives cannot have negative parts.`] : []
  return {
    points: points.map(p => ({ x: p.x.toString(), y: p.y.toString() })),
    spec: {
      engineVersion: ENGINE_VERSION,
      method: method as SplitMethodId,
      precision,
      workingPrecision: workingPrecision(precision),
      rounding: 'half-even, residue by largest remainder',
      width,
      groups: groups.map(g => ({ from: g.from.toString(), to: g.to.toString(), total: g.total.toString() })),
    },
    diagnostics: { totalsKept: kept, adjusted: { count: adjustedCount, at: adjustedAt }, negatives: { count: negativeCount, first: negatives }, notes },
  }
}

/**
 * Round a group's values so that they add up to its total exactly. The total is rounded half-even to p significant digits;
 * every value is rounded half-even to the decimal places of that last digit (one quantum q); what is left over, a whole
 * number of quanta (at most about half the group's width), goes one quantum at a time to the values whose rounding discarded
 * most in that direction (largest remainder: Hamilton's apportionment rule; ties to the lowest age).
 */
export function roundToTotal(values: Dec[], total: Dec, p: number): { rounded: Dec[], adjusted: number[], target: Dec } {
  const D = total.constructor as DecimalCtor
  const target = roundTo(total, p)
  const largest = values.reduce((m, v) => (v.abs().gt(m) ? v.abs() : m), target.abs())
  if (largest.isZero()) return { rounded: values.map(() => new D(0)), adjusted: [], target }
  const places = p - 1 - (target.isZero() ? largest.e : target.e)
  const q = new D(10).pow(-places)
  const rounded = values.map(v => v.div(q).toDecimalPlaces(0, D.ROUND_HALF_EVEN).times(q))
  const residue = target.minus(rounded.reduce((s, v) => s.plus(v), new D(0))).div(q).round().toNumber()
  if (residue === 0) return { rounded, adjusted: [], target }
  const up = residue > 0
  // discarded part v - r: the largest first when adding (rounded down most), the smallest first when taking away (rounded up most)
  const order = values.map((_, j) => j).sort((a, b) => {
    const da = values[a]!.minus(rounded[a]!)
    const db = values[b]!.minus(rounded[b]!)
    return (up ? db.cmp(da) : da.cmp(db)) || a - b
  })
  const adjusted: number[] = []
  for (let k = 0; k < Math.abs(residue); k += 1) {
    const j = order[k % order.length]!
    rounded[j] = up ? rounded[j]!.plus(q) : rounded[j]!.minus(q)
    adjusted.push(j)
  }
  return { rounded, adjusted: [...new Set(adjusted)].sort((a, b) => a - b), target }
}
