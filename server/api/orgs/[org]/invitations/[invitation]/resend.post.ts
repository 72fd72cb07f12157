import { invitationParamsSchema } from '#shared/schemas/route-params'
import { resendInvitation } from '~~/server/services/invitations'

// Sends a fresh link (the previous one stops working) valid for another 7 days.
export default defineEventHandler(async (event) => {
  const access = await requirePermission(event, 'members:manage')
  const { invitation } = readValidParams(event, invitationParamsSchema)
  return resendInvitation(event, access, invitation)
})
