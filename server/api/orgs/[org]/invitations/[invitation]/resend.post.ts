import { z } from 'zod'
import { resendInvitation } from '~~/server/services/invitations'

const params = z.object({ invitation: z.string().max(64) })

// Sends a fresh link (the previous one stops working) valid for another 7 days.
export default defineEventHandler(async (event) => {
  const access = await requirePermission(event, 'members:manage')
  const { invitation } = readValidParams(event, params)
  return resendInvitation(event, access, invitation)
})
