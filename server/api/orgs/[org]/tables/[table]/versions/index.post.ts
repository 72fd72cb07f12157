import { tableParamsSchema } from '#shared/schemas/route-params'
import { newDraftSchema } from '#shared/schemas/tables'
import { newDraftFrom } from '~~/server/services/versions'

// A new working draft copied from a signed-off or withdrawn version.
export default defineEventHandler(async (event) => {
  const access = await requirePermission(event, 'tables:edit')
  const { table } = readValidParams(event, tableParamsSchema)
  const { fromNumber } = await readValidBody(event, newDraftSchema)
  setResponseStatus(event, 201)
  return newDraftFrom(event, access, table, fromNumber)
})
