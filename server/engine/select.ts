import { quote } from './decimal'
import { EngineError } from './errors'
import { fill } from './fill'
import { fill2d } from './fill2d'
import { resolvePrecision, workingContext, workingPrecision } from './precision'
import { selectChecks, type SelectTable } from './select-checks'
import { selectMoney } from './select-money'
import type { Knot, Knot2D, SelectCell, SelectFillRequest, SelectFillResult } from './types'
import { ENGINE_VERSION } from './version'

/**
 * Select-and-ultimate fill of a two-way table: the select block (rows x by durations d) by fill2d with a method per
 * axis, the ultimate column (d null) by the x method as a one-way fill over the same rows; then the checks a select
 * table needs and the money along the select-then-ultimate path (select-checks.ts, select-money.ts).
 */
export function fillSelect(request: SelectFillRequest): SelectFillResult {
  if (typeof request !== 'object' || request === null || !Array.isArray(request.cells)) throw new EngineError('invalid-request', 'The request must be an object with a list of cells.')
  const knots: Knot2D[] = []
  const ultimate: Knot[] = []
  for (const c of request.cells) {
    if (typeof c !== 'object' || c === null) throw new EngineError('invalid-request', `Each cell must be {x, d, y}; got ${quote(c)}.`)
    if (c.d === null) ultimate.push({ x: c.x, y: c.y })
    else knots.push({ x: c.x, d: c.d, y: c.y })
  }
  if (!knots.length) throw new EngineError('too-few-points', 'A two-way fill needs given cells in the select columns, not only the ultimate column.')
  const P = resolvePrecision(request.precision)
  const common = { transform: request.transform, extrapolation: request.extrapolation, precision: P, kind: request.kind }
  const select = fill2d({ knots, method: request.method, grid: request.grid, ...common })
  const gx = request.grid.x
  const ult = ultimate.length
    ? fill({ knots: ultimate, method: request.method.x.method, options: request.method.x.options, ...(Array.isArray(gx) ? { at: gx } : { grid: gx }), ...common })
    : null
  const F = workingContext(workingPrecision(P))
  const table: SelectTable = toTable(select.points, ult?.points ?? null, F)
  const points: SelectCell[] = [...select.points, ...(ult?.points ?? []).map(p => ({ x: p.x, d: null, y: p.y }))]
  return {
    points,
    spec: { engineVersion: ENGINE_VERSION, select: select.spec, ultimate: ult?.spec ?? null, selectPeriod: table.period },
    checks: selectChecks(table, request.kind ?? 'other', F),
    money: selectMoney(table, request.kind ?? 'other', request.money, F, P),
    maxKnotDeviation: select.diagnostics.maxKnotDeviation,
  }
}

/** Rows ascending, each with its select values by d ascending and its ultimate value (null without a column). */
function toTable(selectPoints: Knot2D[], ultPoints: Knot[] | null, F: ReturnType<typeof workingContext>): SelectTable {
  const xs = [...new Set(selectPoints.map(p => p.x))].map(x => new F(x)).sort((a, b) => a.cmp(b))
  const ds = [...new Set(selectPoints.map(p => p.d))].map(d => new F(d)).sort((a, b) => a.cmp(b))
  const at = new Map(selectPoints.map(p => [`${new F(p.x).toString()}|${new F(p.d).toString()}`, new F(p.y)]))
  const ult = new Map((ultPoints ?? []).map(p => [new F(p.x).toString(), new F(p.y)]))
  const values = xs.map(x => ds.map(d => at.get(`${x.toString()}|${d.toString()}`)!))
  // select period n when the durations are 0, 1, ..., n - 1: the ultimate column of row x is then attained age x + n
  const period = ds.every((d, j) => d.eq(j)) ? ds.length : null
  return { xs, ds, values, ultimate: ultPoints ? xs.map(x => ult.get(x.toString()) ?? null) : null, period }
}
