import { z } from 'zod'
import { revokeReadToken } from '~~/server/services/read-tokens'

const paramsSchema = z.object({ token: z.string().uuid({ message: 'Not a read token id' }) })

// Revokes a read token at once; it answers 401 from the next request on.
export default defineEventHandler(async (event) => {
  const access = await requirePermission(event, 'members:manage')
  const { token } = readValidParams(event, paramsSchema)
  await revokeReadToken(event, access, token)
  return { ok: true }
})
