import { z } from 'zod'
import { listAudit } from '~~/server/services/audit-trail'

const day = z.string().regex(/^\d{4}-\d{2}-\d{2}$/, 'Dates are written YYYY-MM-DD')
  .refine(d => !Number.isNaN(Date.parse(`${d}T00:00:00Z`)) && new Date(`${d}T00:00:00Z`).toISOString().startsWith(d), 'That is not a calendar date')
const querySchema = z.object({
  table: z.string().max(64).optional(),
  person: z.string().max(254).optional(),
  action: z.string().max(64).regex(/^[a-z.-]*$/, 'Pick an action from the list').optional(),
  from: day.optional(),
  to: day.optional(),
  page: z.coerce.number().int().min(1).max(100_000).default(1),
  pageSize: z.coerce.number().int().min(10).max(200).default(50),
})

// The audit trail of the organisation, newest first, with its members' sign-ins (labelled as system records).
export default defineEventHandler(async (event) => {
  const { org } = await requirePermission(event, 'tables:read')
  const query = readValidQuery(event, querySchema)
  return listAudit(org.id, { ...query, table: query.table || undefined, person: query.person || undefined, action: query.action || undefined })
})
