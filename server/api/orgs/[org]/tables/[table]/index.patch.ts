import { z } from 'zod'
import { tableUpdateSchema } from '#shared/schemas/tables'
import { updateTable } from '~~/server/services/versions'

const paramsSchema = z.object({ table: z.string().max(64) })

export default defineEventHandler(async (event) => {
  const access = await requirePermission(event, 'tables:edit')
  const { table } = readValidParams(event, paramsSchema)
  const input = await readValidBody(event, tableUpdateSchema)
  return updateTable(event, access, table, input)
})
