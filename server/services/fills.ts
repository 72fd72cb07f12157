import { performance } from 'node:perf_hooks'
import { QueryTypes } from 'sequelize'
import type { H3Event } from 'h3'
import { compareAsync, fill, EngineError, METHODS, TRANSFORM_LISTING, ENGINE_VERSION, REVIEW_CAUTION } from '../engine/index'
import type { FillResult } from '../engine/types'
import type { OrgAccess } from '../utils/auth'
import type { CompareInput, SaveFillInput } from '#shared/schemas/fills'
import type { CompareResponseDto, FillMethodsDto, SavedFillDto, StoredFillSpec } from '#shared/types/fills'
import { findTable, findVersion } from './tables'
import { insertPoints, readPoints } from './points-store'
import { buildFillRequest } from './fill-request'

type Row = Record<string, unknown>

export function fillMethods(): FillMethodsDto {
  return { methods: [...METHODS], transforms: [...TRANSFORM_LISTING], engineVersion: ENGINE_VERSION, caution: REVIEW_CAUTION }
}

/** An engine refusal is the user's to fix: 400 with the engine's own words. */
function engineFailure(error: unknown): never {
  if (error instanceof EngineError) throw apiError(400, 'engine-refused', error.message, { engineCode: error.code, point: error.point })
  throw error
}

/** Every chosen method over the version's stored points, through the engine's compare (read-only: any version). */
export async function runCompare(access: OrgAccess, tableId: string, number: number, input: CompareInput, gone: () => boolean = () => false): Promise<CompareResponseDto> {
  const report = (done: number) => { if (input.runId) setProgress(access.user.id, input.runId, done, input.methods.length) }
  report(0)
  const table = await findTable(access.org.id, tableId)
  const version = await findVersion(access.org.id, tableId, number)
  const knots = await readPoints(version.id)
  const base = { knots, kind: table.kind }
  const requests = input.methods.map(m => buildFillRequest(base, input, m))
  const started = performance.now()
  let result
  try {
    const specs = input.methods.map((m, i) => ({ method: m.method, options: m.options ?? {}, transform: requests[i]!.transform, ...(m.label ? { label: m.label } : {}) }))
    // between methods: let other requests run, and stop if the person cancelled (the connection is gone)
    let resumed = performance.now()
    result = await compareAsync(requests[0]!, specs, input.baseline ? { baseline: input.baseline } : {}, async (filled, of) => {
      report(filled)
      if (filled === of) return // the last method: only the pairwise differences are left, no one to make room for
      // a slice of 5 % of the method's time (2 to 25 ms), so waiting requests, including this run's progress request with
      // its session and role checks in the database, get through; a single event-loop turn is not enough for that
      const slice = Math.min(25, Math.max(2, (performance.now() - resumed) * 0.05))
      await new Promise(resolve => setTimeout(resolve, slice))
      resumed = performance.now()
      if (gone()) throw apiError(499, 'cancelled', 'The comparison was cancelled.')
    })
  }
  catch (error) { engineFailure(error) }
  const engineMs = performance.now() - started
  return { result, engineMs, knots, kind: table.kind, axis: table.axis, status: version.status, lockVersion: version.lockVersion, pointCount: knots.length }
}

/**
 * Makes one method the draft's fill. The server re-runs the engine on the stored points (client values are never taken),
 * under the optimistic lock: a stale lockVersion, or a version that is no longer a draft, gets 409 and changes nothing.
 */
export async function saveFill(event: H3Event, access: OrgAccess, tableId: string, number: number, input: SaveFillInput): Promise<SavedFillDto> {
  const table = await findTable(access.org.id, tableId)
  await inTransaction(async (t) => {
    const version = await findVersion(access.org.id, tableId, number, { transaction: t, lock: true })
    if (version.status !== 'draft') throw apiError(409, 'not-a-draft', 'Only a working draft takes a fill; start a new draft from this version.')
    if (version.lockVersion !== input.lockVersion) {
      throw apiError(409, 'draft-conflict', 'This draft changed after you opened the bench (points or fill saved by someone). Run the comparison again, then choose.', { lockVersion: version.lockVersion })
    }
    const knots = await readPoints(version.id, t)
    let result: FillResult
    try { result = fill(buildFillRequest({ knots, kind: table.kind }, input, input.choice)) }
    catch (error) { engineFailure(error) }
    const label = input.choice.label ?? METHODS.find(m => m.id === result.spec.method)?.label ?? result.spec.method
    const spec: StoredFillSpec = { ...result.spec, bench: { grid: input.grid, label, pointsHash: version.contentHash } }
    await useDb().query(
      `UPDATE table_versions SET lock_version = lock_version + 1, fill_spec = :spec::jsonb, fill_rationale = :rationale,
         fill_diagnostics = :diagnostics::jsonb, fill_money = :money::jsonb, filled_by = :userId, filled_at = now(), updated_at = now()
       WHERE id = :id`,
      { replacements: { id: version.id, spec: JSON.stringify(spec), rationale: input.rationale, diagnostics: JSON.stringify(result.diagnostics), money: JSON.stringify(result.money), userId: access.user.id }, transaction: t })
    await useDb().query('DELETE FROM version_fill_points WHERE version_id = :id', { replacements: { id: version.id }, transaction: t })
    await insertPoints(version.id, result.points, t, 'version_fill_points')
    await audit(event, {
      orgId: access.org.id, action: 'version.fill.save', objectType: 'table_version', objectId: version.id,
      detail: { tableId, number, method: result.spec.method, options: result.spec.options, transform: result.spec.transform, label, points: result.points.length, engineVersion: result.spec.engineVersion, pointsHash: version.contentHash, lockVersion: version.lockVersion + 1, rationale: input.rationale },
    }, t)
  })
  return (await getFill(access.org.id, tableId, number, false))!
}

/** The version's chosen fill (null when none), optionally with its values. */
export async function getFill(orgId: string, tableId: string, number: number, withPoints: boolean): Promise<SavedFillDto | null> {
  const { id } = await findVersion(orgId, tableId, number)
  const [found] = await useDb().query<Row>(
    `SELECT v.id, v.fill_spec, v.fill_rationale, v.fill_diagnostics, v.fill_money, v.filled_at, v.content_hash, v.lock_version,
            u.id AS user_id, u.name AS user_name, (SELECT count(*)::int FROM version_fill_points f WHERE f.version_id = v.id) AS point_count
     FROM table_versions v LEFT JOIN users u ON u.id = v.filled_by
     WHERE v.id = :id`,
    { replacements: { id }, type: QueryTypes.SELECT })
  const row = found!
  if (!row.fill_spec) return null
  const spec = row.fill_spec as StoredFillSpec
  const dto: SavedFillDto = {
    versionId: row.id as string,
    spec,
    rationale: row.fill_rationale as string,
    diagnostics: row.fill_diagnostics as SavedFillDto['diagnostics'],
    money: row.fill_money as SavedFillDto['money'],
    filledBy: row.user_id ? { id: row.user_id as string, name: row.user_name as string } : null,
    filledAt: new Date(row.filled_at as string).toISOString(),
    pointCount: row.point_count as number,
    stale: spec.bench?.pointsHash !== row.content_hash,
    lockVersion: row.lock_version as number,
  }
  if (withPoints) {
    dto.points = await readPoints(id, undefined, 'version_fill_points')
  }
  return dto
}
