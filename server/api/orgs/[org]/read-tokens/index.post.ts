import { readTokenCreateSchema } from '#shared/schemas/read-tokens'
import { createReadToken } from '~~/server/services/read-tokens'

// Creates a read token for a production system, for every signed-off table or only some; the answer carries the token,
// which is not shown again.
export default defineEventHandler(async (event) => {
  const access = await requirePermission(event, 'members:manage')
  const { name, tables } = await readValidBody(event, readTokenCreateSchema)
  setResponseStatus(event, 201)
  return createReadToken(event, access, name, tables)
})
