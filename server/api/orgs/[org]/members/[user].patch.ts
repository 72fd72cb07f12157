import { z } from 'zod'
import { roleChangeSchema } from '#shared/schemas/members'
import { changeRole } from '~~/server/services/members'

const params = z.object({ user: z.uuid({ message: 'No such member.' }) })

// Gives a member another role; effective on their next request (roles are read per request).
export default defineEventHandler(async (event) => {
  const access = await requirePermission(event, 'members:manage')
  const { user } = readValidParams(event, params)
  const { role } = await readValidBody(event, roleChangeSchema)
  await changeRole(event, access, user, role)
  return { ok: true }
})
