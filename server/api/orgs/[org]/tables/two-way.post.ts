import { createTwoWaySchema } from '#shared/schemas/two-way'
import { createTwoWayTable } from '~~/server/services/two-way'

// Creates a two-way table (row axis by column axis, optional ultimate column) with working draft 1 holding its given cells.
export default defineEventHandler(async (event) => {
  const access = await requirePermission(event, 'tables:edit')
  const input = await readValidBody(event, createTwoWaySchema)
  setResponseStatus(event, 201)
  return createTwoWayTable(event, access, input)
})
