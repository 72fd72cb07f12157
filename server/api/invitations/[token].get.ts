import type { InvitationPreviewDto } from '#shared/types/api'
import { previewInvitation } from '~~/server/services/invitations'

// Public: what an invitation link offers (organisation, address, role). 404 for a used, cancelled or expired link.
export default defineEventHandler(async (event): Promise<InvitationPreviewDto> => {
  const token = getRouterParam(event, 'token')
  const session = await readSession(event)
  return previewInvitation(token, session?.user?.email ?? null)
})
