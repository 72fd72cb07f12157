import { tableParamsSchema } from '#shared/schemas/route-params'
import { tableUpdateSchema } from '#shared/schemas/tables'
import { updateTable } from '~~/server/services/versions'

export default defineEventHandler(async (event) => {
  const access = await requirePermission(event, 'tables:edit')
  const { table } = readValidParams(event, tableParamsSchema)
  const input = await readValidBody(event, tableUpdateSchema)
  return updateTable(event, access, table, input)
})
