import { QueryTypes, type Transaction } from 'sequelize'
import type { H3Event } from 'h3'
import type { OrgAccess } from '../utils/auth'
import type { CellDto, TableDto, VersionDto } from '#shared/types/tables'
import type { CreateTwoWayInput, SaveCellsInput } from '#shared/schemas/two-way'
import { checkAxis, checkValue } from '#shared/table-rules'
import type { TableKind } from '#shared/tables'
import { canonicalDecimal } from '#shared/decimal-text'
import { gridContentHash, sortCells } from '../lib/points-hash'
import { RateTable } from '../database/models'
import { insertCells } from './cells-store'
import { findTable } from './tables'
import { claimDraft, describeTable, getVersion } from './versions'

// Two-way tables (issue 17): made with their given cells, saved under the same optimistic lock, hash, audit and
// freeze rules as one-way points (migration 1201 gives the cell tables the 0401 freeze trigger and the 0701 hash).

/** Refuses cells a stored table could not hold: negative axis values, values outside the kind's range. */
function checkCells(kind: TableKind, cells: CellDto[], hasUltimate: boolean): CellDto[] {
  const problems: string[] = []
  for (const c of cells) {
    const at = `row ${c.x}, ${c.d === null ? 'ultimate' : `column ${c.d}`}`
    for (const f of [checkAxis(c.x), c.d === null ? null : checkAxis(c.d), checkValue(kind, c.y)]) {
      if (f?.severity === 'error') problems.push(`${at}: ${f.message}`)
    }
    if (c.d === null && !hasUltimate) problems.push(`${at}: this table has no ultimate column`)
  }
  if (problems.length) throw apiError(400, 'invalid-input', problems[0]!, { issues: problems.slice(0, 50).map(message => ({ path: 'cells', message })) })
  return sortCells(cells.map(c => ({ x: canonicalDecimal(c.x), d: c.d === null ? null : canonicalDecimal(c.d), y: canonicalDecimal(c.y) })))
}

/** A new two-way table with working draft 1 holding the given cells. */
export async function createTwoWayTable(event: H3Event, access: OrgAccess, input: CreateTwoWayInput): Promise<TableDto> {
  const tableId = await inTransaction(t => insertTwoWayTable(event, access, input, {}, t))
  return describeTable(access.org.id, tableId)
}

/** The table, its draft 1 and their audit events, inside the caller's transaction (the import creates them with its own events). */
export async function insertTwoWayTable(event: H3Event, access: OrgAccess, input: CreateTwoWayInput, origin: { importId?: string, notes?: string }, t: Transaction): Promise<string> {
  const cells = checkCells(input.kind, input.cells, input.hasUltimate)
  const hash = gridContentHash(cells)
  const orgId = access.org.id
  if (await RateTable.findOne({ where: { orgId, name: input.name }, transaction: t })) throw apiError(409, 'name-taken', `A table called "${input.name}" already exists.`)
  const table = await RateTable.create({
    orgId, name: input.name, kind: input.kind, axis: input.axis, axisUnit: input.axisUnit, valueUnit: input.valueUnit, description: input.description,
    shape: 'two-way', colAxis: input.colAxis, colAxisUnit: input.colAxisUnit, hasUltimate: input.hasUltimate, createdBy: access.user.id,
  }, { transaction: t })
  const [v] = await useDb().query<{ id: string }>(
    `INSERT INTO table_versions (org_id, table_id, number, status, author_id, notes, content_hash)
     VALUES (:orgId, :tableId, 1, 'draft', :userId, :notes, :hash) RETURNING id`,
    { replacements: { orgId, tableId: table.id, userId: access.user.id, notes: origin.notes ?? '', hash }, type: QueryTypes.SELECT, transaction: t })
  await insertCells(v!.id, cells, t)
  await audit(event, { orgId, action: 'table.create', objectType: 'rate_table', objectId: table.id, detail: { name: input.name, kind: input.kind, valueUnit: input.valueUnit, shape: 'two-way', colAxis: input.colAxis, hasUltimate: input.hasUltimate, ...(origin.importId ? { importId: origin.importId } : {}) } }, t)
  await audit(event, { orgId, action: 'version.create', objectType: 'table_version', objectId: v!.id, detail: { tableId: table.id, number: 1, cells: cells.length, contentHash: hash } }, t)
  return table.id
}

/** Saves a two-way draft's cells under the optimistic lock: a stale lockVersion gets 409 and changes nothing. */
export async function saveCells(event: H3Event, access: OrgAccess, tableId: string, number: number, input: SaveCellsInput): Promise<VersionDto> {
  const table = await findTable(access.org.id, tableId)
  if (table.shape !== 'two-way') throw apiError(409, 'wrong-shape', 'This is a one-way table: save its points (axis value, value) instead of cells.')
  const cells = checkCells(table.kind, input.cells, table.hasUltimate)
  const hash = gridContentHash(cells)
  await inTransaction(async (t) => {
    const { versionId, lockVersion } = await claimDraft(access, tableId, number, { hash, notes: input.notes, lockVersion: input.lockVersion }, t)
    await useDb().query('DELETE FROM version_grid_points WHERE version_id = :versionId', { replacements: { versionId }, transaction: t })
    await insertCells(versionId, cells, t)
    await audit(event, { orgId: access.org.id, action: 'version.points.save', objectType: 'table_version', objectId: versionId, detail: { tableId, number, cells: cells.length, contentHash: hash, lockVersion } }, t)
  })
  return getVersion(access.org.id, tableId, number)
}
