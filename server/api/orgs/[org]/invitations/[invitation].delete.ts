import { invitationParamsSchema } from '#shared/schemas/route-params'
import { cancelInvitation } from '~~/server/services/invitations'

export default defineEventHandler(async (event) => {
  const access = await requirePermission(event, 'members:manage')
  const { invitation } = readValidParams(event, invitationParamsSchema)
  await cancelInvitation(event, access, invitation)
  return { ok: true }
})
