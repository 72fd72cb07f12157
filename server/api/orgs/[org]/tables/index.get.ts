import { z } from 'zod'
import { TABLE_KINDS, VERSION_STATUSES } from '#shared/tables'
import { listTables } from '~~/server/services/tables'

const querySchema = z.object({
  q: z.string().trim().max(120).optional(),
  kind: z.enum(TABLE_KINDS).optional(),
  status: z.enum(VERSION_STATUSES).optional(),
  sort: z.enum(['name', 'updated', 'kind']).default('name'),
})

export default defineEventHandler(async (event) => {
  const { org } = await requirePermission(event, 'tables:read')
  const query = readValidQuery(event, querySchema)
  return listTables(org.id, query)
})
