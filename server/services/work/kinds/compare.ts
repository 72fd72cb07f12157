import type { CompareInput } from '#shared/schemas/fills'
import { runTask } from '~~/server/lib/work/pool'
import { findTable, findVersion } from '../../tables'
import { readPoints } from '../../points-store'
import { buildFillRequest } from '../../fill-request'
import type { RunExecutor } from './index'

export interface CompareRunInput { tableId: string, number: number, compare: CompareInput }

/** Every chosen method over the version's stored points, in a worker thread; the answer is CompareResponseDto as JSON. */
export const executeCompare: RunExecutor = async ({ run, signal, progress }) => {
  const { tableId, number, compare } = run.input as unknown as CompareRunInput
  const json = await compareJson(run.orgId, tableId, number, compare, signal, progress)
  return async () => json
}

/** The comparison of the organisation's version as CompareResponseDto JSON text (also for the unsigned download). */
export async function compareJson(orgId: string, tableId: string, number: number, compare: CompareInput, signal?: AbortSignal, progress?: (done: number, total: number) => void): Promise<string> {
  const table = await findTable(orgId, tableId)
  const version = await findVersion(orgId, tableId, number)
  const knots = await readPoints(version.id)
  const requests = compare.methods.map(m => buildFillRequest({ knots, kind: table.kind, compounding: table.compounding }, compare, m))
  const methods = compare.methods.map((m, i) => ({ method: m.method, options: m.options ?? {}, transform: requests[i]!.transform, ...(m.label ? { label: m.label } : {}) }))
  const out = await runTask('compare', { request: requests[0]!, methods, options: compare.baseline ? { baseline: compare.baseline } : {} }, { signal, onProgress: progress })
  // the comparison stays the worker's JSON text; only the small fields around it are written here
  const rest = JSON.stringify({ engineMs: out.engineMs, knots, kind: table.kind, compounding: table.compounding, axis: table.axis, status: version.status, lockVersion: version.lockVersion, pointCount: knots.length })
  return `{"result":${out.json},${rest.slice(1)}`
}
