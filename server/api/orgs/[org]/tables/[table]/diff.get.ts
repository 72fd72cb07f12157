import { z } from 'zod'
import { tableParamsSchema } from '#shared/schemas/route-params'
import { diffVersions } from '~~/server/services/version-diff'

const querySchema = z.object({ a: z.coerce.number().int().min(1).max(1_000_000), b: z.coerce.number().int().min(1).max(1_000_000) })

// Two versions side by side: points added, removed or changed, fill settings, largest value difference, money view.
export default defineEventHandler(async (event) => {
  const { org } = await requirePermission(event, 'tables:read')
  const { table } = readValidParams(event, tableParamsSchema)
  const { a, b } = readValidQuery(event, querySchema)
  return diffVersions(org.id, table, a, b)
})
