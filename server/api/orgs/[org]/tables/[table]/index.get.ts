import { tableParamsSchema } from '#shared/schemas/route-params'
import { describeTable } from '~~/server/services/versions'

export default defineEventHandler(async (event) => {
  const { org } = await requirePermission(event, 'tables:read')
  const { table } = readValidParams(event, tableParamsSchema)
  return describeTable(org.id, table)
})
