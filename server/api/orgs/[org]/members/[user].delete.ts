import { memberParamsSchema } from '#shared/schemas/route-params'
import { removeMember } from '~~/server/services/members'

// Removes a member: their access ends at once and their sessions are ended.
export default defineEventHandler(async (event) => {
  const access = await requirePermission(event, 'members:manage')
  const { user } = readValidParams(event, memberParamsSchema)
  await removeMember(event, access, user)
  return { ok: true }
})
