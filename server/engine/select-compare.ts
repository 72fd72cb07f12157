import { fillSelect } from './select'
import { resolvePrecision, workingContext, workingPrecision } from './precision'
import type { AxisMethod, SelectCompareResult, SelectFillRequest } from './types'

/** The label of a choice: "linear × cubic-natural" (rows × durations) unless the caller named it. */
export function choiceLabel(c: { x: AxisMethod, d: AxisMethod, label?: string }): string {
  return c.label ?? `${c.x.method} × ${c.d.method}`
}

/**
 * Every choice on the same cells and grid (one fillSelect each), and how far each lies from the first: the largest
 * absolute difference over every filled cell, the ultimate column included.
 */
export function compareSelect(request: Omit<SelectFillRequest, 'method'>, choices: { x: AxisMethod, d: AxisMethod, label?: string }[], onEach?: (done: number) => void): SelectCompareResult {
  const runs = choices.map((c, k) => {
    const result = fillSelect({ ...request, method: { x: c.x, d: c.d } })
    onEach?.(k + 1)
    return { label: choiceLabel(c), result }
  })
  const F = workingContext(workingPrecision(resolvePrecision(request.precision)))
  const key = (p: { x: string, d: string | null }) => `${p.x}/${p.d ?? 'ultimate'}`
  const base = new Map(runs[0]?.result.points.map(p => [key(p), p.y]) ?? [])
  const differences = runs.map(({ label, result }) => {
    let worst = new F(0)
    let at: string | null = null
    for (const p of result.points) {
      const b = base.get(key(p))
      if (b === undefined) continue
      const d = new F(p.y).minus(b).abs()
      if (d.gt(worst)) { worst = d; at = key(p) }
    }
    return { label, maxAbsDiff: worst.toString(), at }
  })
  return { choices: runs, differences }
}
