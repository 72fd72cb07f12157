import { computeDiagnostics } from './diagnostics'
import { computeMoney } from './money'
import type { ResolvedPoints } from './grid'
import { fillCore } from './pipeline'
import type { FillRequest, FillResult } from './types'

/** Fill a table: fit the chosen method to the knots, evaluate at the grid, then check the shape and show the money. */
export function fill(request: FillRequest): FillResult {
  return fillAt(request)
}

/** fill() at output points already resolved for the request's precision (compare shares one resolution between methods). */
export function fillAt(request: FillRequest, points?: ResolvedPoints): FillResult {
  const core = fillCore(request, points)
  const diagnostics = computeDiagnostics(core)
  const money = computeMoney(core)
  return { points: core.output, diagnostics, money, spec: core.spec }
}
