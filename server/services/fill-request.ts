import type { Compounding, FillRequest, TableKind } from '../engine/types'
import { CURVE_KINDS } from '#shared/engine/contract'
import type { CompareInput, MethodChoice } from '#shared/schemas/fills'
import { isClosureRule } from '#shared/fills'

export interface FillBase { knots: { x: string, y: string }[], kind: TableKind, compounding?: Compounding }

/** One engine request for a method choice under the bench settings. */
export function buildFillRequest(base: FillBase, settings: Omit<CompareInput, 'methods' | 'baseline'>, choice: MethodChoice): FillRequest {
  return {
    knots: base.knots,
    kind: base.kind,
    // a curve's rates are read and reported under the table's compounding (the engine takes it for curve kinds only)
    ...(base.compounding && (CURVE_KINDS as readonly string[]).includes(base.kind) ? { compounding: base.compounding } : {}),
    method: choice.method,
    options: choice.options ?? {},
    // log-linear works on ln y by construction; the engine refuses another transform on top of it
    transform: choice.transform ?? (choice.method === 'log-linear' ? 'none' : settings.transform),
    extrapolation: settings.extrapolation,
    // the closure's options go to the engine only with a closure rule (other rules take none)
    ...(isClosureRule(settings.extrapolation) && settings.extrapolationOptions ? { extrapolationOptions: { ...settings.extrapolationOptions } } : {}),
    // a fraction step (1/12 for months) goes to the engine as it is: the engine resolves it (and records it in the spec)
    grid: { from: settings.grid.from, to: settings.grid.to, step: settings.grid.step },
    ...(settings.precision ? { precision: settings.precision } : {}),
    ...(settings.money ? { money: settings.money } : {}),
  }
}
