import { z } from 'zod'
import { cancelInvitation } from '~~/server/services/invitations'

const params = z.object({ invitation: z.string().max(64) })

export default defineEventHandler(async (event) => {
  const access = await requirePermission(event, 'members:manage')
  const { invitation } = readValidParams(event, params)
  await cancelInvitation(event, access, invitation)
  return { ok: true }
})
