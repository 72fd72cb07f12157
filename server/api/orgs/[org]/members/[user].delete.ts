import { z } from 'zod'
import { removeMember } from '~~/server/services/members'

const params = z.object({ user: z.uuid({ message: 'No such member.' }) })

// Removes a member: their access to this organisation ends at once; their other memberships are untouched.
export default defineEventHandler(async (event) => {
  const access = await requirePermission(event, 'members:manage')
  const { user } = readValidParams(event, params)
  await removeMember(event, access, user)
  return { ok: true }
})
