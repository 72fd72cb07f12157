import { tableParamsSchema } from '#shared/schemas/route-params'
import { listVersions } from '~~/server/services/versions'
import { findTable } from '~~/server/services/tables'

export default defineEventHandler(async (event) => {
  const { org } = await requirePermission(event, 'tables:read')
  const { table } = readValidParams(event, tableParamsSchema)
  await findTable(org.id, table)
  return listVersions(org.id, table)
})
