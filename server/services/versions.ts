import { QueryTypes, type Transaction } from 'sequelize'
import type { H3Event } from 'h3'
import type { OrgAccess } from '../utils/auth'
import type { TableDto, VersionDto, VersionSummaryDto } from '#shared/types/tables'
import type { GraduationRecord } from '#shared/types/graduation'
import type { SavePointsInput, TableUpdateInput } from '#shared/schemas/tables'
import { checkAxis, checkValue } from '#shared/table-rules'
import { UNIT_KIND_MESSAGE, unitFitsKind } from '#shared/tables'
import { pointsContentHash } from '../lib/points-hash'
import { RateTable } from '../database/models'
import { insertPoints, readPoints } from './points-store'
import { readCells } from './cells-store'
import { findTable, findVersion } from './tables'
import { sortPoints } from '../lib/import/validate'

const SUMMARY_SQL = `
  SELECT v.id, v.number, v.status, v.notes, v.content_hash, v.lock_version, v.created_at, v.updated_at,
         u.id AS author_id, u.name AS author_name,
         (SELECT count(*)::int FROM version_points p WHERE p.version_id = v.id)
           + (SELECT count(*)::int FROM version_grid_points c WHERE c.version_id = v.id) AS point_count,
         v.graduation, (SELECT g.name FROM users g WHERE g.id::text = v.graduation->>'by') AS graduated_by_name
  FROM table_versions v LEFT JOIN users u ON u.id = v.author_id
  WHERE v.org_id = :orgId AND v.table_id = :tableId`

type Row = Record<string, unknown>
const toSummary = (r: Row): VersionSummaryDto => ({
  id: r.id as string,
  number: r.number as number,
  status: r.status as VersionSummaryDto['status'],
  author: r.author_id ? { id: r.author_id as string, name: r.author_name as string } : null,
  notes: r.notes as string,
  contentHash: r.content_hash as string,
  lockVersion: r.lock_version as number,
  pointCount: r.point_count as number,
  createdAt: new Date(r.created_at as string).toISOString(),
  updatedAt: new Date(r.updated_at as string).toISOString(),
  graduation: graduationRecord(r),
})

/** How the version was graduated (the graduate step), or null. */
function graduationRecord(r: Row): GraduationRecord | null {
  const g = r.graduation as { fromNumber: number, spec: GraduationRecord['spec'], rationale: string, at: string } | null
  return g ? { fromNumber: g.fromNumber, spec: g.spec, rationale: g.rationale, byName: (r.graduated_by_name as string | null) ?? null, at: g.at } : null
}

export async function listVersions(orgId: string, tableId: string): Promise<VersionSummaryDto[]> {
  const rows = await useDb().query<Row>(`${SUMMARY_SQL} ORDER BY v.number DESC`, { replacements: { orgId, tableId }, type: QueryTypes.SELECT })
  return rows.map(toSummary)
}

export async function describeTable(orgId: string, tableId: string): Promise<TableDto> {
  const t = await findTable(orgId, tableId)
  return {
    id: t.id, name: t.name, kind: t.kind, axis: t.axis, axisUnit: t.axisUnit, valueUnit: t.valueUnit, compounding: t.compounding,
    shape: t.shape, colAxis: t.colAxis ?? null, colAxisUnit: t.colAxisUnit ?? null, hasUltimate: t.hasUltimate,
    description: t.description, tags: t.tags, createdAt: t.createdAt.toISOString(), updatedAt: t.updatedAt.toISOString(),
    versions: await listVersions(orgId, tableId),
  }
}

export async function getVersion(orgId: string, tableId: string, number: number): Promise<VersionDto> {
  const { id } = await findVersion(orgId, tableId, number)
  const [row] = await useDb().query<Row>(`${SUMMARY_SQL} AND v.id = :id`, { replacements: { orgId, tableId, id }, type: QueryTypes.SELECT })
  return { ...toSummary(row!), points: await readPoints(id), cells: await readCells(id) }
}

export async function updateTable(event: H3Event, access: OrgAccess, tableId: string, input: TableUpdateInput): Promise<TableDto> {
  const table = await findTable(access.org.id, tableId)
  const meaning = (['kind', 'axis', 'axisUnit', 'valueUnit', 'compounding'] as const).filter(k => input[k] !== undefined && input[k] !== table[k])
  if (!unitFitsKind(input.kind ?? table.kind, input.valueUnit ?? table.valueUnit)) throw apiError(400, 'invalid-input', UNIT_KIND_MESSAGE, { issues: [{ path: 'valueUnit', message: UNIT_KIND_MESSAGE }] })
  if (meaning.length) {
    // what the numbers mean is part of what a reviewer checked and signed: it is fixed once a version left draft
    const [row] = await useDb().query<{ n: number }>(`SELECT count(*)::int AS n FROM table_versions WHERE table_id = :tableId AND status <> 'draft'`, { replacements: { tableId: table.id }, type: QueryTypes.SELECT })
    if (row!.n > 0) {
      throw apiError(409, 'meaning-fixed', 'The kind, axis, units and compounding cannot change once a version has been submitted for review or signed off. Name, description and tags can; for another kind or unit, create a new table.')
    }
  }
  if (input.name && input.name !== table.name && await RateTable.findOne({ where: { orgId: access.org.id, name: input.name } })) {
    throw apiError(409, 'name-taken', `A table called "${input.name}" already exists.`)
  }
  await inTransaction(async (t) => {
    const before = { name: table.name, kind: table.kind, valueUnit: table.valueUnit, axis: table.axis, axisUnit: table.axisUnit, compounding: table.compounding, tags: table.tags }
    await table.update(input, { transaction: t })
    await audit(event, { orgId: access.org.id, action: 'table.update', objectType: 'rate_table', objectId: table.id, detail: { before, changes: input } }, t)
  })
  return describeTable(access.org.id, tableId)
}

/** Saves a draft's points under the optimistic lock: a stale lockVersion gets 409 and changes nothing. */
export async function savePoints(event: H3Event, access: OrgAccess, tableId: string, number: number, input: SavePointsInput): Promise<VersionDto> {
  const table = await findTable(access.org.id, tableId)
  if (table.shape === 'two-way') throw apiError(409, 'wrong-shape', 'This is a two-way table: save its cells (row, column, value) instead of points.')
  const problems: string[] = []
  for (const p of input.points) {
    const a = checkAxis(p.x)
    const v = checkValue(table.kind, p.y)
    if (a?.severity === 'error') problems.push(`x = ${p.x}: ${a.message}`)
    if (v?.severity === 'error') problems.push(`x = ${p.x}: ${v.message}`)
  }
  if (problems.length) throw apiError(400, 'invalid-input', problems[0]!, { issues: problems.slice(0, 50).map(message => ({ path: 'points', message })) })
  const points = sortPoints(input.points)
  const hash = pointsContentHash(points)
  await inTransaction(async (t) => {
    const { versionId, lockVersion } = await claimDraft(access, tableId, number, { hash, notes: input.notes, lockVersion: input.lockVersion }, t)
    await useDb().query('DELETE FROM version_points WHERE version_id = :versionId', { replacements: { versionId }, transaction: t })
    await insertPoints(versionId, points, t)
    await audit(event, { orgId: access.org.id, action: 'version.points.save', objectType: 'table_version', objectId: versionId, detail: { tableId, number, points: points.length, contentHash: hash, lockVersion } }, t)
  })
  return getVersion(access.org.id, tableId, number)
}

/** A new working draft (number + 1) with the points of a signed-off or withdrawn version. */
export async function newDraftFrom(event: H3Event, access: OrgAccess, tableId: string, fromNumber: number): Promise<VersionDto> {
  const number = await inTransaction(async (t) => {
    await findTable(access.org.id, tableId, { transaction: t, lock: true })
    const versions = await useDb().query<Row>('SELECT id, number, status, content_hash FROM table_versions WHERE org_id = :orgId AND table_id = :tableId ORDER BY number',
      { replacements: { orgId: access.org.id, tableId }, type: QueryTypes.SELECT, transaction: t })
    const source = versions.find(v => v.number === fromNumber) ?? notFound('version')
    if (source.status !== 'approved' && source.status !== 'retired') throw apiError(409, 'wrong-state', 'A new draft starts from a signed-off or withdrawn version.')
    const open = versions.find(v => v.status === 'draft' || v.status === 'in-review')
    if (open) throw apiError(409, 'version-open', `Version ${open.number} is still open (${open.status === 'draft' ? 'a working draft' : 'awaiting a second check'}); continue there.`)
    const next = (versions.at(-1)!.number as number) + 1
    const [created] = await useDb().query<Row>(
      `INSERT INTO table_versions (org_id, table_id, number, status, author_id, notes, content_hash)
       VALUES (:orgId, :tableId, :next, 'draft', :author, :notes, :hash) RETURNING id`,
      { replacements: { orgId: access.org.id, tableId, next, author: access.user.id, notes: `Started from version ${fromNumber}.`, hash: source.content_hash }, type: QueryTypes.SELECT, transaction: t })
    const newId = created!.id as string
    await useDb().query(`INSERT INTO version_points (version_id, x, y) SELECT :newId, x, y FROM version_points WHERE version_id = :from;
      INSERT INTO version_grid_points (version_id, x, d, y) SELECT :newId, x, d, y FROM version_grid_points WHERE version_id = :from`,
      { replacements: { newId, from: source.id }, transaction: t })
    await audit(event, { orgId: access.org.id, action: 'version.create', objectType: 'table_version', objectId: newId, detail: { tableId, number: next, from: fromNumber } }, t)
    return next
  })
  return getVersion(access.org.id, tableId, number)
}

/**
 * The save of a working draft's content under the optimistic lock (points or cells alike): bumps the lock version and
 * records the new content hash and notes, or refuses with 409 (`not-a-draft`, or `draft-conflict` with the current lock
 * version) and changes nothing. Inside the caller's transaction, which then replaces the content.
 */
export async function claimDraft(access: OrgAccess, tableId: string, number: number, save: { hash: string, notes?: string | null, lockVersion: number }, t: Transaction): Promise<{ versionId: string, lockVersion: number }> {
  const rows = await useDb().query<{ id: string, lock_version: number }>(
    `UPDATE table_versions SET lock_version = lock_version + 1, content_hash = :hash, notes = coalesce(:notes, notes), updated_at = now()
     WHERE org_id = :orgId AND table_id = :tableId AND number = :number AND status = 'draft' AND lock_version = :lock RETURNING id, lock_version`,
    { replacements: { hash: save.hash, notes: save.notes ?? null, orgId: access.org.id, tableId, number, lock: save.lockVersion }, type: QueryTypes.SELECT, transaction: t })
  if (!rows.length) {
    const current = await findVersion(access.org.id, tableId, number, { transaction: t })
    if (current.status !== 'draft') throw apiError(409, 'not-a-draft', 'Only a working draft can be edited; start a new draft from this version.')
    throw apiError(409, 'draft-conflict', 'Someone saved this draft after you opened it. Your edits are kept on screen: reload their version, then apply yours again.', { lockVersion: current.lockVersion })
  }
  return { versionId: rows[0]!.id, lockVersion: rows[0]!.lock_version }
}
