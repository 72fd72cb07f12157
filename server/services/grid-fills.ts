import { QueryTypes } from 'sequelize'
import type { H3Event } from 'h3'
import { METHODS, REVIEW_CAUTION, TRANSFORM_LISTING, type SelectFillRequest } from '../engine/index'
import { runTask } from '../lib/work/pool'
import type { OrgAccess } from '../utils/auth'
import type { GridCompareInput, GridFillInput } from '#shared/schemas/grid-fills'
import type { GridCompareDto, SavedGridFillDto, StoredGridSpec } from '#shared/types/grid-fills'
import { gridSpecRows } from '#shared/fill-words'
import { AXIS_LABELS, COL_AXIS_LABELS, type ColAxis } from '#shared/tables'
import { FITTED_ON, findTable, findVersion } from './tables'
import { insertCells, readCells } from './cells-store'
import type { RateTable } from '../database/models'
import { engineFailure } from './engine-refusal'

// The two-way fill bench (issue 17): compare choices of a method per axis on the stored cells, then record one as the
// draft's fill (values re-computed on the server, never taken from the browser) under the draft's lock, audited; the
// stale-fill trigger (migrations 0701 and 1201) ties it to the cells it was fitted on.

type Row = Record<string, unknown>

async function twoWay(orgId: string, tableId: string): Promise<RateTable> {
  const table = await findTable(orgId, tableId)
  if (table.shape !== 'two-way') throw apiError(409, 'wrong-shape', 'This is a one-way table: use the fill bench for points.')
  return table
}

function request(table: RateTable, cells: SelectFillRequest['cells'], input: GridCompareInput | GridFillInput): Omit<SelectFillRequest, 'method'> {
  return { cells, grid: input.grid, transform: input.transform, extrapolation: input.extrapolation, precision: input.precision, kind: table.kind, money: input.money }
}

export async function compareGrid(access: OrgAccess, tableId: string, number: number, input: GridCompareInput, signal?: AbortSignal): Promise<GridCompareDto> {
  const table = await twoWay(access.org.id, tableId)
  const v = await findVersion(access.org.id, tableId, number)
  const cells = await readCells(v.id)
  try { return { ...await runTask('gridCompare', { request: request(table, cells, input), choices: input.choices }, { signal }), caution: REVIEW_CAUTION } }
  catch (error) { engineFailure(error) }
}

export async function saveGridFill(event: H3Event, access: OrgAccess, tableId: string, number: number, input: GridFillInput, signal?: AbortSignal): Promise<SavedGridFillDto> {
  const table = await twoWay(access.org.id, tableId)
  const read = await findVersion(access.org.id, tableId, number)
  const cells = await readCells(read.id)
  let result: Awaited<ReturnType<typeof runTask<'gridFill'>>>
  try { result = await runTask('gridFill', { ...request(table, cells, input), method: { x: input.choice.x, d: input.choice.d } }, { signal }) }
  catch (error) { engineFailure(error) }
  await inTransaction(async (t) => {
    const version = await findVersion(access.org.id, tableId, number, { transaction: t, lock: true })
    if (version.status !== 'draft') throw apiError(409, 'not-a-draft', 'Only a working draft takes a fill; start a new draft from this version.')
    if (version.lockVersion !== input.lockVersion || version.lockVersion !== read.lockVersion) {
      throw apiError(409, 'draft-conflict', 'This draft changed after you opened the bench (cells or fill saved by someone). Compare again, then choose.', { lockVersion: version.lockVersion })
    }
    const label = input.choice.label ?? `${input.choice.x.method} × ${input.choice.d.method}`
    const spec: StoredGridSpec = { ...result.spec, shape: 'two-way', bench: { grid: input.grid, label, pointsHash: version.contentHash, money: input.money } }
    await useDb().query(
      `UPDATE table_versions SET lock_version = lock_version + 1, fill_spec = :spec::jsonb, fill_rationale = :rationale,
         fill_diagnostics = :diagnostics::jsonb, fill_money = :money::jsonb, filled_by = :userId, filled_at = now(), updated_at = now(),
         fill_points_hash = :pointsHash, fill_lock_version = lock_version + 1
       WHERE id = :id`,
      { replacements: { id: version.id, pointsHash: version.contentHash, spec: JSON.stringify(spec), rationale: input.rationale, diagnostics: JSON.stringify({ checks: result.checks, maxKnotDeviation: result.maxKnotDeviation }), money: JSON.stringify(result.money), userId: access.user.id }, transaction: t })
    await useDb().query('DELETE FROM version_grid_fill_points WHERE version_id = :id', { replacements: { id: version.id }, transaction: t })
    await insertCells(version.id, result.points, t, 'version_grid_fill_points')
    await audit(event, {
      orgId: access.org.id, action: 'version.fill.save', objectType: 'table_version', objectId: version.id,
      detail: { tableId, number, shape: 'two-way', methods: result.spec.select.methods, label, cells: result.points.length, engineVersion: result.spec.engineVersion, pointsHash: version.contentHash, lockVersion: version.lockVersion + 1, rationale: input.rationale },
    }, t)
  })
  return (await getGridFill(access.org.id, tableId, number, false))!
}

/** The two-way version's chosen fill (null when none), optionally with its values. */
export async function getGridFill(orgId: string, tableId: string, number: number, withCells: boolean): Promise<SavedGridFillDto | null> {
  const table = await twoWay(orgId, tableId)
  const { id } = await findVersion(orgId, tableId, number)
  const [row] = await useDb().query<Row>(
    `SELECT v.id, v.fill_spec, v.fill_rationale, v.fill_diagnostics, v.fill_money, v.filled_at, v.content_hash, v.lock_version,
            ${FITTED_ON} AS fitted_on, v.fill_lock_version, u.id AS user_id, u.name AS user_name,
            (SELECT count(*)::int FROM version_grid_fill_points f WHERE f.version_id = v.id) AS cell_count
     FROM table_versions v LEFT JOIN users u ON u.id = v.filled_by WHERE v.id = :id`,
    { replacements: { id }, type: QueryTypes.SELECT })
  if (!row?.fill_spec) return null
  const spec = row.fill_spec as StoredGridSpec
  const diagnostics = row.fill_diagnostics as { checks: SavedGridFillDto['checks'], maxKnotDeviation: string }
  const names = { rows: AXIS_LABELS[table.axis].toLowerCase(), columns: COL_AXIS_LABELS[table.colAxis as ColAxis].toLowerCase() }
  return {
    versionId: id, spec, rationale: row.fill_rationale as string, checks: diagnostics.checks, maxKnotDeviation: diagnostics.maxKnotDeviation,
    money: row.fill_money as SavedGridFillDto['money'],
    filledBy: row.user_id ? { id: row.user_id as string, name: row.user_name as string } : null,
    filledAt: new Date(row.filled_at as string).toISOString(),
    cellCount: row.cell_count as number,
    stale: row.fitted_on !== row.content_hash,
    fittedOn: { contentHash: (row.fitted_on as string | null) ?? null, lockVersion: (row.fill_lock_version as number | null) ?? null },
    settings: gridSpecRows(spec, METHODS, TRANSFORM_LISTING, names),
    lockVersion: row.lock_version as number,
    ...(withCells ? { cells: await readCells(id, undefined, 'version_grid_fill_points') } : {}),
  }
}
