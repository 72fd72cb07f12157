import { QueryTypes, type Transaction } from 'sequelize'
import type { TableSummaryDto } from '#shared/types/api'
import type { TableKind, VersionStatus } from '#shared/tables'
import { isUuid } from '#shared/schemas/route-params'
import { RateTable } from '../database/models'

// The one place that finds a table or a version of an organisation. Another organisation's object, a missing one and a
// malformed id all answer the same 404, so existence is never revealed.

export interface LookupOptions { transaction?: Transaction, lock?: boolean }

/** The table of this organisation, or 404. With `lock`, the table row is locked FOR UPDATE in the transaction. */
export async function findTable(orgId: string, tableId: string, options: LookupOptions = {}): Promise<RateTable> {
  const { transaction, lock } = options
  const table = isUuid(tableId) ? await RateTable.findOne({ where: { id: tableId, orgId }, transaction, ...(lock && transaction ? { lock: transaction.LOCK.UPDATE } : {}) }) : null
  return table ?? notFound('table')
}

/** The content hash of the points a version's fill was fitted on (fill_points_hash, migration 0701; before it, the bench's record). */
export const FITTED_ON = `coalesce(v.fill_points_hash, v.fill_spec->'bench'->>'pointsHash')`

/** What every caller needs to know about a version; other columns are read by id where needed. */
export interface VersionRecord {
  id: string
  number: number
  status: VersionStatus
  tableId: string
  tableName: string
  lockVersion: number
  contentHash: string
  authorId: string | null
  filledBy: string | null
  submittedBy: string | null
  /** A fill is recorded (spec and values). */
  hasFill: boolean
  /** The recorded fill was fitted on other points than the version holds now (its content hash differs). */
  fillStale: boolean
}

/** Version `number` of the organisation's table, or 404. With `lock`, the version row is locked FOR UPDATE in the transaction. */
export async function findVersion(orgId: string, tableId: string, number: number, options: LookupOptions = {}): Promise<VersionRecord> {
  const { transaction, lock } = options
  if (!isUuid(tableId) || !Number.isSafeInteger(number)) notFound('version')
  const [row] = await useDb().query<Record<string, unknown>>(`
    SELECT v.id, v.number, v.status, v.table_id, rt.name AS table_name, v.lock_version, v.content_hash, v.author_id, v.filled_by, v.submitted_by,
           (v.fill_spec IS NOT NULL AND (EXISTS (SELECT 1 FROM version_fill_points f WHERE f.version_id = v.id)
             OR EXISTS (SELECT 1 FROM version_grid_fill_points g WHERE g.version_id = v.id))) AS has_fill,
           (v.fill_spec IS NOT NULL AND ${FITTED_ON} IS DISTINCT FROM v.content_hash) AS fill_stale
    FROM table_versions v JOIN rate_tables rt ON rt.id = v.table_id
    WHERE v.org_id = :orgId AND v.table_id = :tableId AND v.number = :number ${lock && transaction ? 'FOR UPDATE OF v' : ''}`,
  { replacements: { orgId, tableId, number }, type: QueryTypes.SELECT, transaction })
  if (!row) notFound('version')
  return {
    id: row.id as string, number: row.number as number, status: row.status as VersionStatus, tableId: row.table_id as string,
    tableName: row.table_name as string, lockVersion: row.lock_version as number, contentHash: row.content_hash as string,
    authorId: row.author_id as string | null, filledBy: row.filled_by as string | null, submittedBy: row.submitted_by as string | null,
    hasFill: row.has_fill as boolean, fillStale: row.fill_stale as boolean,
  }
}

export interface TableListQuery { q?: string; kind?: TableKind; status?: VersionStatus; sort: 'name' | 'updated' | 'kind' }

/** Tables of one organisation with their latest and approved versions. */
export async function listTables(orgId: string, query: TableListQuery): Promise<TableSummaryDto[]> {
  const order = { name: 't.name ASC', updated: 'updated_at DESC', kind: 't.kind ASC, t.name ASC' }[query.sort]
  const rows = await useDb().query<Record<string, unknown>>(`
    SELECT t.id, t.name, t.kind, t.axis, t.value_unit, t.tags,
           (SELECT count(*)::int FROM table_versions v WHERE v.table_id = t.id) AS versions,
           l.number AS latest_number, l.status AS latest_status, l.updated_at AS latest_updated,
           (SELECT max(number) FROM table_versions v WHERE v.table_id = t.id AND v.status = 'approved') AS approved_number,
           greatest(t.updated_at, l.updated_at) AS updated_at
    FROM rate_tables t
    LEFT JOIN LATERAL (SELECT number, status, updated_at FROM table_versions v WHERE v.table_id = t.id ORDER BY number DESC LIMIT 1) l ON true
    WHERE t.org_id = :orgId
      AND (:q::text IS NULL OR t.name ILIKE '%' || :q || '%' OR t.description ILIKE '%' || :q || '%' OR :q = ANY(t.tags))
      AND (:kind::text IS NULL OR t.kind = :kind)
      AND (:status::text IS NULL OR l.status = :status)
    ORDER BY ${order}`,
  { replacements: { orgId, q: query.q || null, kind: query.kind ?? null, status: query.status ?? null }, type: QueryTypes.SELECT })
  return rows.map(r => ({
    id: r.id as string,
    name: r.name as string,
    kind: r.kind as TableKind,
    axis: r.axis as TableSummaryDto['axis'],
    valueUnit: r.value_unit as TableSummaryDto['valueUnit'],
    tags: r.tags as string[],
    versions: r.versions as number,
    latest: r.latest_number ? { number: r.latest_number as number, status: r.latest_status as VersionStatus, updatedAt: new Date(r.latest_updated as string).toISOString() } : null,
    approvedNumber: (r.approved_number as number | null) ?? null,
    updatedAt: new Date(r.updated_at as string).toISOString(),
  }))
}
