import type { H3Event } from 'h3'
import { acceptExistingAccountSchema, acceptNewAccountSchema } from '#shared/schemas/members'
import { Invitation, Membership, Organisation, User } from '../database/models'
import { hashPassword } from '../lib/password'
import { checkPassword } from './auth'
import { invitationByToken } from './invitations'

/**
 * Accepts an invitation: the invitee either creates an account (name + password), or joins with the account that
 * already has the invited address (signed in as it, or by giving its password). Single use: the row is locked and
 * marked accepted in the same transaction that adds the membership.
 */
export async function acceptInvitation(event: H3Event, token: string, body: unknown): Promise<{ user: User; orgSlug: string }> {
  const preview = await invitationByToken(token)
  const session = await readSession(event)
  const existing = await User.findOne({ where: { email: preview.email } })
  let verified = false
  if (existing && session?.user?.id === existing.id) {
    verified = (await requireUser(event).then(() => true, () => false))
  }
  let newAccount: { name: string; passwordHash: string } | null = null
  if (existing && !verified) {
    const { password } = parseOr400(acceptExistingAccountSchema, body)
    if (!(await checkPassword(event, existing.email, existing.passwordHash, password, 'Too many failed sign-ins'))) {
      throw apiError(401, 'wrong-credentials', `That is not the password of ${existing.email}. Try again, or use "Forgot password" on the sign-in page.`)
    }
  } else if (!existing) {
    const input = parseOr400(acceptNewAccountSchema, body)
    newAccount = { name: input.name, passwordHash: await hashPassword(input.password) }
  }
  const result = await inTransaction(async (t) => {
    const invitation: Invitation = await invitationByToken(token, t)
    const org = (await Organisation.findByPk(invitation.orgId, { transaction: t }))!
    let user = await User.findOne({ where: { email: invitation.email }, transaction: t })
    if (!user) {
      if (!newAccount) throw apiError(409, 'reload-needed', 'Reload the page and try again.')
      user = await User.create({ email: invitation.email, ...newAccount }, { transaction: t })
    }
    const actor = { id: user.id, email: user.email }
    const already = await Membership.findOne({ where: { orgId: org.id, userId: user.id }, transaction: t })
    if (!already) {
      await Membership.create({ orgId: org.id, userId: user.id, role: invitation.role }, { transaction: t })
      await audit(event, { orgId: org.id, action: 'member.add', objectType: 'user', objectId: user.id, detail: { role: invitation.role, via: 'invitation', invitation: invitation.id, newAccount: !!newAccount }, actor }, t)
    }
    await invitation.update({ acceptedAt: new Date(), acceptedBy: user.id }, { transaction: t })
    await audit(event, { orgId: org.id, action: 'invitation.accept', objectType: 'invitation', objectId: invitation.id, detail: { email: invitation.email, role: invitation.role, alreadyMember: !!already }, actor }, t)
    return { user, orgSlug: org.slug }
  })
  if (!verified) await startSession(event, result.user)
  return result
}
