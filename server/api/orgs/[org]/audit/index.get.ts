import { activeFilters, auditPageSchema } from '#shared/schemas/audit'
import { listAudit } from '~~/server/services/audit-trail'
import { ensureDailyCheckpoint } from '~~/server/services/audit-anchor'

// The audit trail of the organisation, newest first, with its members' sign-ins (labelled as system records), each event
// as a sentence with names. The first read of a UTC day also writes the day's signed checkpoint of the trail's head.
export default defineEventHandler(async (event) => {
  const { org } = await requirePermission(event, 'tables:read')
  const query = readValidQuery(event, auditPageSchema)
  await ensureDailyCheckpoint(org)
  return listAudit(org.id, activeFilters(query))
})
