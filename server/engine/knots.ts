import { describeFailure, parseDecimal, quote, type Dec, type DecimalCtor } from './decimal'
import { EngineError } from './errors'

export interface ParsedKnots {
  /** Sorted ascending, distinct. */
  x: Dec[]
  y: Dec[]
  /** 1-based position of each sorted knot in the request, for messages. */
  position: number[]
}

const MAX_KNOTS = 10_000

/** Parse, check and sort the knots. Messages name the point by its position in the request and its x. */
export function parseKnots(D: DecimalCtor, knots: unknown): ParsedKnots {
  if (!Array.isArray(knots)) throw new EngineError('invalid-request', 'Knots must be a list of {x, y} points.')
  if (knots.length > MAX_KNOTS) throw new EngineError('invalid-request', `At most ${MAX_KNOTS} knots are accepted; ${knots.length} were given.`)
  const rows: { x: Dec, y: Dec, position: number }[] = []
  knots.forEach((knot: unknown, index) => {
    const position = index + 1
    if (typeof knot !== 'object' || knot === null) {
      throw new EngineError('invalid-knot', `Point ${position} is not an {x, y} pair.`, position)
    }
    const { x: rawX, y: rawY } = knot as { x?: unknown, y?: unknown }
    const px = parseDecimal(D, rawX)
    if (!px.ok) throw new EngineError('invalid-knot', `Point ${position}: x ${quote(rawX)} ${describeFailure(px.reason)}.`, position)
    const py = parseDecimal(D, rawY)
    if (!py.ok) {
      throw new EngineError('invalid-knot', `Point ${position} (x = ${px.value.toString()}): y ${quote(rawY)} ${describeFailure(py.reason)}.`, position)
    }
    rows.push({ x: px.value, y: py.value, position })
  })
  rows.sort((a, b) => a.x.cmp(b.x) || a.position - b.position)
  for (let i = 1; i < rows.length; i += 1) {
    if (rows[i]!.x.eq(rows[i - 1]!.x)) {
      const a = rows[i - 1]!
      const b = rows[i]!
      throw new EngineError('duplicate-x', `Points ${a.position} and ${b.position} have the same x = ${b.x.toString()}; each x may appear once.`, b.position)
    }
  }
  return { x: rows.map(r => r.x), y: rows.map(r => r.y), position: rows.map(r => r.position) }
}

/** Refuse unequal spacing (formulas on equally spaced values only), naming the first step that differs; returns the step. */
export function assertEqualSpacing(who: string, what: string, x: Dec[], hint: string): Dec {
  const h = x[1]!.minus(x[0]!)
  for (let i = 2; i < x.length; i += 1) {
    const hi = x[i]!.minus(x[i - 1]!)
    if (!hi.eq(h)) {
      throw new EngineError('unequal-spacing', `${who} needs equally spaced points (${what}): the step is ${h.toString()} from ${x[0]!.toString()} to ${x[1]!.toString()} `
        + `but ${hi.toString()} from ${x[i - 1]!.toString()} to ${x[i]!.toString()}. ${hint}`)
    }
  }
  return h
}
