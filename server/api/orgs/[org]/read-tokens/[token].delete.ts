import { readTokenParamsSchema } from '#shared/schemas/route-params'
import { revokeReadToken } from '~~/server/services/read-tokens'

// Revokes a read token at once; it answers 401 from the next request on.
export default defineEventHandler(async (event) => {
  const access = await requirePermission(event, 'members:manage')
  const { token } = readValidParams(event, readTokenParamsSchema)
  await revokeReadToken(event, access, token)
  return { ok: true }
})
