import { inviteSchema } from '#shared/schemas/members'
import { createInvitation } from '~~/server/services/invitations'

// Invites an address with a role and e-mails the link; 409 when every purchased seat is in use.
export default defineEventHandler(async (event) => {
  const access = await requirePermission(event, 'members:manage')
  const { email, role } = await readValidBody(event, inviteSchema)
  const invitation = await createInvitation(event, access, email, role)
  setResponseStatus(event, 201)
  return invitation
})
