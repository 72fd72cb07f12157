import Decimal from 'decimal.js'
import type { FillRequest, TableKind } from '../engine/types'
import { parseStep } from '#shared/fills'
import type { BenchGrid, CompareInput, MethodChoice } from '#shared/schemas/fills'

/** Digits after the point for grid abscissae of a fractional step (1/12 of a year is kept to 1e-12 years). */
const FRACTION_DIGITS = 12
const X = Decimal.clone({ precision: 60, rounding: Decimal.ROUND_HALF_EVEN, toExpNeg: -60, toExpPos: 60 })

/**
 * The engine's points for a bench grid: a decimal step is passed on as a grid; a fraction a/b (1/12 for months) becomes an
 * explicit list x_k = from + k a / b, each rounded half-even to 12 decimals, so whole and half years stay exact.
 */
export function gridToEngine(grid: BenchGrid): Pick<FillRequest, 'grid' | 'at'> {
  if (!grid.step.includes('/')) return { grid: { from: grid.from, to: grid.to, step: grid.step } }
  const { num, den } = parseStep(grid.step)!
  const from = new X(grid.from)
  const to = new X(grid.to)
  const step = new X(num.toString()).div(den.toString())
  const at: string[] = []
  for (let k = 0; ; k += 1) {
    const x = from.plus(new X(k).times(num.toString()).div(den.toString()))
    if (x.gt(to.plus(step.div(1e6)))) break
    at.push(x.toDecimalPlaces(FRACTION_DIGITS).toString())
  }
  return { at }
}

export interface FillBase { knots: { x: string, y: string }[], kind: TableKind }

/** One engine request for a method choice under the bench settings. */
export function buildFillRequest(base: FillBase, settings: Omit<CompareInput, 'methods' | 'baseline'>, choice: MethodChoice): FillRequest {
  return {
    knots: base.knots,
    kind: base.kind,
    method: choice.method,
    options: choice.options ?? {},
    // log-linear works on ln y by construction; the engine refuses another transform on top of it
    transform: choice.transform ?? (choice.method === 'log-linear' ? 'none' : settings.transform),
    extrapolation: settings.extrapolation,
    ...gridToEngine(settings.grid),
    ...(settings.precision ? { precision: settings.precision } : {}),
    ...(settings.money ? { money: settings.money } : {}),
  }
}
