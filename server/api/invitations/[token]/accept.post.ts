import { acceptInvitation } from '~~/server/services/invitation-accept'
import { describeMe } from '~~/server/services/me'

// Public: accept with a new account (name + password) or with the invited address's existing account.
export default defineEventHandler(async (event) => {
  const token = getRouterParam(event, 'token') ?? ''
  const body = await readBody(event).catch(() => ({}))
  const { user, orgSlug } = await acceptInvitation(event, token, body ?? {})
  return { org: orgSlug, me: await describeMe(user) }
})
