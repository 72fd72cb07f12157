import { z } from 'zod'
import { listVersions } from '~~/server/services/versions'
import { findTable } from '~~/server/services/tables'

const paramsSchema = z.object({ table: z.string().max(64) })

export default defineEventHandler(async (event) => {
  const { org } = await requirePermission(event, 'tables:read')
  const { table } = readValidParams(event, paramsSchema)
  await findTable(org.id, table)
  return listVersions(org.id, table)
})
