import type { InvitationDto } from '#shared/types/api'
import { listInvitations } from '~~/server/services/invitations'

export default defineEventHandler(async (event): Promise<InvitationDto[]> => {
  const { org } = await requirePermission(event, 'members:manage')
  return listInvitations(org.id)
})
