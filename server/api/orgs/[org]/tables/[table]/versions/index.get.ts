import { z } from 'zod'
import { findTable, listVersions } from '~~/server/services/versions'

const paramsSchema = z.object({ table: z.string().max(64) })

export default defineEventHandler(async (event) => {
  const { org } = await requirePermission(event, 'tables:read')
  const { table } = readValidParams(event, paramsSchema)
  await findTable(org.id, table)
  return listVersions(org.id, table)
})
