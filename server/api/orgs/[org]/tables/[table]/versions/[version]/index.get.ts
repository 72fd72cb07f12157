import { z } from 'zod'
import { getVersion } from '~~/server/services/versions'

const paramsSchema = z.object({ table: z.string().max(64), version: z.coerce.number().int().min(1).max(1_000_000) })

export default defineEventHandler(async (event) => {
  const { org } = await requirePermission(event, 'tables:read')
  const { table, version } = readValidParams(event, paramsSchema)
  return getVersion(org.id, table, version)
})
