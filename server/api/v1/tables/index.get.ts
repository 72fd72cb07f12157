import { QueryTypes } from 'sequelize'
import { requireReadToken } from '~~/server/services/read-tokens'
import type { ReadTableSummaryDto } from '#shared/types/read-tokens'

// For production systems (Authorization: Bearer <read token>): the organisation's tables that have a signed-off version
// (only those the token is limited to, if it is).
export default defineEventHandler(async (event): Promise<ReadTableSummaryDto[]> => {
  const { org, tableIds } = await requireReadToken(event)
  const rows = await useDb().query<Record<string, unknown>>(`
    SELECT t.id, t.name, t.kind, t.axis, t.axis_unit, t.value_unit, v.number, v.content_hash, v.approved_at, v.fill_spec IS NOT NULL AS filled
    FROM rate_tables t JOIN table_versions v ON v.table_id = t.id AND v.status = 'approved'
    WHERE t.org_id = :orgId ${tableIds ? 'AND t.id IN (:tableIds)' : ''} ORDER BY t.name`, { replacements: { orgId: org.id, tableIds }, type: QueryTypes.SELECT })
  return rows.map(r => ({
    id: r.id as string, name: r.name as string, kind: r.kind as string, axis: r.axis as string, axisUnit: r.axis_unit as string, valueUnit: r.value_unit as string,
    signedOff: { number: r.number as number, contentHash: r.content_hash as string, approvedAt: r.approved_at ? new Date(r.approved_at as string).toISOString() : null, filled: r.filled as boolean },
  }))
})
