import { memberParamsSchema } from '#shared/schemas/route-params'
import { removeMember } from '~~/server/services/members'

// Removes a member: their access to this organisation ends at once; their other memberships and sessions are untouched.
export default defineEventHandler(async (event) => {
  const access = await requirePermission(event, 'members:manage')
  const { user } = readValidParams(event, memberParamsSchema)
  await removeMember(event, access, user)
  return { ok: true }
})
