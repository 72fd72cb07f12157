import { QueryTypes } from 'sequelize'
import type { H3Event } from 'h3'
import { METHODS, TRANSFORM_LISTING, ENGINE_VERSION, REVIEW_CAUTION } from '../engine/index'
import { runTask } from '../lib/work/pool'
import type { FillTaskOutput } from '../lib/work/tasks/engine'
import type { OrgAccess } from '../utils/auth'
import { gridPointCount } from '#shared/fills'
import type { CompareInput, SaveFillInput } from '#shared/schemas/fills'
import type { FillMethodsDto, SavedFillDto, StoredFillSpec } from '#shared/types/fills'
import { FITTED_ON, findTable, findVersion } from './tables'
import { insertPointChunks, readPoints } from './points-store'
import { buildFillRequest } from './fill-request'
import { specRows } from '#shared/fill-words'
import { HEAVY_WORK, newRunKey, startRun } from './work/start'
import type { CompareRunInput } from './work/kinds/compare'
import { engineFailure } from './engine-refusal'

type Row = Record<string, unknown>

export function fillMethods(): FillMethodsDto {
  return { methods: [...METHODS], transforms: [...TRANSFORM_LISTING], engineVersion: ENGINE_VERSION, caution: REVIEW_CAUTION }
}

/** An engine refusal is the user's to fix: 400 with the engine's own words. */
/** The one-way bench refuses a two-way table (its cells go to the two-way bench: services/grid-fills.ts). */
function oneWay<T extends { shape: string }>(table: T): T {
  if (table.shape === 'two-way') throw apiError(409, 'wrong-shape', 'This is a two-way table: use the two-way fill bench (a method per axis).')
  return table
}

/**
 * Starts a comparison of every chosen method over the version's stored points (read-only: any version) as a run: light
 * ones here at once, heavy ones (a fine grid, many methods, transforms) on the queue for any node. 404 before anything
 * starts when the version is not the caller's organisation's.
 */
export async function startCompare(access: OrgAccess, tableId: string, number: number, input: CompareInput): Promise<{ id: string, runKey: string }> {
  oneWay(await findTable(access.org.id, tableId))
  await findVersion(access.org.id, tableId, number)
  const points = gridPointCount(input.grid.from, input.grid.to, input.grid.step) ?? 0
  const work = input.methods.reduce((sum, m) => sum + points * ((m.transform ?? input.transform) !== 'none' || m.method === 'log-linear' ? 20 : 1), 0)
  const runInput: CompareRunInput = { tableId, number, compare: input }
  return startRun(access, { kind: 'compare', runKey: input.runId ?? newRunKey(), heavy: work > HEAVY_WORK, input: runInput as never, total: input.methods.length })
}

/**
 * Makes one method the draft's fill. The server re-runs the engine on the stored points (client values are never taken),
 * under the optimistic lock: a stale lockVersion, or a version that is no longer a draft, gets 409 and changes nothing.
 */
export async function saveFill(event: H3Event, access: OrgAccess, tableId: string, number: number, input: SaveFillInput, signal?: AbortSignal): Promise<SavedFillDto> {
  const table = oneWay(await findTable(access.org.id, tableId))
  // the engine runs in a worker thread before the transaction, so no row stays locked while it computes; the lock
  // version read with the points must still be the draft's when the values are written
  const read = await findVersion(access.org.id, tableId, number)
  const knots = await readPoints(read.id)
  let result: FillTaskOutput
  try { result = await runTask('fill', buildFillRequest({ knots, kind: table.kind, compounding: table.compounding }, input, input.choice), { signal }) }
  catch (error) { engineFailure(error) }
  await inTransaction(async (t) => {
    const version = await findVersion(access.org.id, tableId, number, { transaction: t, lock: true })
    if (version.status !== 'draft') throw apiError(409, 'not-a-draft', 'Only a working draft takes a fill; start a new draft from this version.')
    if (version.lockVersion !== input.lockVersion || version.lockVersion !== read.lockVersion) {
      throw apiError(409, 'draft-conflict', 'This draft changed after you opened the bench (points or fill saved by someone). Run the comparison again, then choose.', { lockVersion: version.lockVersion })
    }
    const label = input.choice.label ?? METHODS.find(m => m.id === result.spec.method)?.label ?? result.spec.method
    const spec: StoredFillSpec = { ...result.spec, bench: { grid: input.grid, label, pointsHash: version.contentHash } }
    await useDb().query(
      `UPDATE table_versions SET lock_version = lock_version + 1, fill_spec = :spec::jsonb, fill_rationale = :rationale,
         fill_diagnostics = :diagnostics::jsonb, fill_money = :money::jsonb, filled_by = :userId, filled_at = now(), updated_at = now(),
         fill_points_hash = :pointsHash, fill_lock_version = lock_version + 1
       WHERE id = :id`,
      { replacements: { id: version.id, pointsHash: version.contentHash, spec: JSON.stringify(spec), rationale: input.rationale, diagnostics: JSON.stringify(result.diagnostics), money: JSON.stringify(result.money), userId: access.user.id }, transaction: t })
    await useDb().query('DELETE FROM version_fill_points WHERE version_id = :id', { replacements: { id: version.id }, transaction: t })
    await insertPointChunks(version.id, result.chunks, t, 'version_fill_points')
    await audit(event, {
      orgId: access.org.id, action: 'version.fill.save', objectType: 'table_version', objectId: version.id,
      detail: { tableId, number, method: result.spec.method, options: result.spec.options, transform: result.spec.transform, label, points: result.pointCount, engineVersion: result.spec.engineVersion, pointsHash: version.contentHash, lockVersion: version.lockVersion + 1, rationale: input.rationale },
    }, t)
  })
  return (await getFill(access.org.id, tableId, number, false))!
}

/** The version's chosen fill (null when none), optionally with its values. */
export async function getFill(orgId: string, tableId: string, number: number, withPoints: boolean): Promise<SavedFillDto | null> {
  oneWay(await findTable(orgId, tableId))
  const { id } = await findVersion(orgId, tableId, number)
  const [found] = await useDb().query<Row>(
    `SELECT v.id, v.fill_spec, v.fill_rationale, v.fill_diagnostics, v.fill_money, v.filled_at, v.content_hash, v.lock_version,
            ${FITTED_ON} AS fitted_on, v.fill_lock_version,
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
    stale: row.fitted_on !== row.content_hash,
    fittedOn: { contentHash: (row.fitted_on as string | null) ?? null, lockVersion: (row.fill_lock_version as number | null) ?? null },
    settings: specRows(spec, METHODS, TRANSFORM_LISTING, row.point_count as number),
    lockVersion: row.lock_version as number,
  }
  if (withPoints) {
    dto.points = await readPoints(id, undefined, 'version_fill_points')
  }
  return dto
}
