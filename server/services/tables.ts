import { QueryTypes } from 'sequelize'
import type { TableSummaryDto } from '#shared/types/api'
import type { TableKind, VersionStatus } from '#shared/tables'

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
