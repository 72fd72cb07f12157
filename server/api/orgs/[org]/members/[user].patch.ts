import { memberParamsSchema } from '#shared/schemas/route-params'
import { roleChangeSchema } from '#shared/schemas/members'
import { changeRole } from '~~/server/services/members'

// Gives a member another role; effective on their next request (roles are read per request).
export default defineEventHandler(async (event) => {
  const access = await requirePermission(event, 'members:manage')
  const { user } = readValidParams(event, memberParamsSchema)
  const { role } = await readValidBody(event, roleChangeSchema)
  await changeRole(event, access, user, role)
  return { ok: true }
})
