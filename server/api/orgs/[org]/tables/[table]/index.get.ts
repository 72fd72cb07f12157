import { z } from 'zod'
import { describeTable } from '~~/server/services/versions'

const paramsSchema = z.object({ table: z.string().max(64) })

export default defineEventHandler(async (event) => {
  const { org } = await requirePermission(event, 'tables:read')
  const { table } = readValidParams(event, paramsSchema)
  return describeTable(org.id, table)
})
