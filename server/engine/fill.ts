import { computeDiagnostics } from './diagnostics'
import { computeMoney } from './money'
import { fillCore } from './pipeline'
import type { FillRequest, FillResult } from './types'

/** Fill a table: fit the chosen method to the knots, evaluate at the grid, then check the shape and show the money. */
export function fill(request: FillRequest): FillResult {
  const core = fillCore(request)
  const diagnostics = computeDiagnostics(core)
  const money = computeMoney(core)
  return { points: core.output, diagnostics, money, spec: core.spec }
}
