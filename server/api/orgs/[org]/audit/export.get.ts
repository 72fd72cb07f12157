import { activeFilters, auditFilterSchema } from '#shared/schemas/audit'
import { auditCsv } from '~~/server/services/audit-csv'

// The trail as CSV (the same filters as the page), oldest first, with each event's hash, the hash before it and the exact
// record the hash covers, so a reader can re-check the chain without Knotwork (docs/audit-trail.md).
export default defineEventHandler(async (event) => {
  const { org } = await requirePermission(event, 'tables:read')
  const query = readValidQuery(event, auditFilterSchema)
  const { fileName, text } = await auditCsv(org, activeFilters(query))
  setResponseHeader(event, 'content-type', 'text/csv; charset=utf-8')
  setResponseHeader(event, 'content-disposition', `attachment; filename="${fileName}"`)
  return text
})
