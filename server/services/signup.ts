import type { H3Event } from 'h3'
import { UniqueConstraintError, type Transaction } from 'sequelize'
import type { SignupComplete } from '#shared/schemas/auth'
import type { MeDto } from '#shared/types/api'
import { Membership, Organisation, SignupRequest, User } from '../database/models'
import { hashPassword } from '../lib/password'
import { hashToken, newToken } from '../lib/tokens'
import { describeMe } from './me'
import { freeSlug } from './organisations'
import { signupAttemptMail, signupLinkMail } from './mail-templates'

const LINK_HOURS = 24
const EXPIRED = 'This sign-up link is not valid any more: it was used or it expired. Start again from the sign-up page.'

/**
 * Step 1: an address asks to sign up. The answer never depends on whether the address is registered: before answering,
 * every request does the same work (throttle, one new link stored); after the answer, a new address gets the link and a
 * registered one gets a notice instead (and its link is spent), so the answer cannot be used to list accounts.
 */
export async function requestSignup(event: H3Event, email: string): Promise<void> {
  const ip = clientAddress(event)
  await holdAttempt(event, [signupRule(ip), { key: `signup-to:${email}`, limit: 5, windowSeconds: 15 * 60 }], 'Too many sign-up requests')
  const { token, hash } = newToken()
  const request = await SignupRequest.create({ email, tokenHash: hash, expiresAt: new Date(Date.now() + LINK_HOURS * 3600_000) })
  afterAnswer(event, 'signup', async () => {
    if (await User.findOne({ where: { email } })) {
      await request.update({ usedAt: new Date() })
      await sendMail(signupAttemptMail(email, appLink('/signin'), appLink('/forgot-password')))
    } else {
      await sendMail(signupLinkMail(email, appLink(`/confirm-signup/${token}`), LINK_HOURS))
    }
  })
}

async function openRequest(token: string, transaction?: Transaction): Promise<SignupRequest> {
  const request = await SignupRequest.findOne({ where: { tokenHash: hashToken(token) }, transaction, ...(transaction ? { lock: transaction.LOCK.UPDATE } : {}) })
  if (!request || request.usedAt || request.expiresAt.getTime() <= Date.now()) throw apiError(400, 'link-expired', EXPIRED)
  return request
}

/** What a sign-up link is for (the address it was sent to), or 400 when it is used or expired. */
export async function signupLink(token: string): Promise<{ email: string; expiresAt: string }> {
  const request = await openRequest(token)
  return { email: request.email, expiresAt: request.expiresAt.toISOString() }
}

/**
 * Step 2, from the e-mailed link: creates the person, the organisation and the admin membership in one transaction and
 * signs the person in. The link is checked before the password is hashed, so only a holder of a link can make us hash.
 */
export async function completeSignup(event: H3Event, input: SignupComplete): Promise<MeDto> {
  await openRequest(input.token)
  const passwordHash = await hashPassword(input.password)
  const user = await inTransaction(async (transaction) => {
    const request = await openRequest(input.token, transaction)
    if (await User.findOne({ where: { email: request.email }, transaction })) throw alreadyRegistered()
    const user = await User.create({ email: request.email, name: input.name, passwordHash }, { transaction })
    const org = await Organisation.create({ name: input.organisation, slug: await freeSlug(input.organisation, transaction) }, { transaction })
    await Membership.create({ orgId: org.id, userId: user.id, role: 'admin' }, { transaction })
    await SignupRequest.update({ usedAt: new Date() }, { where: { email: request.email, usedAt: null }, transaction })
    const actor = { id: user.id, email: user.email }
    await audit(event, { orgId: org.id, action: 'org.create', objectType: 'organisation', objectId: org.id, detail: { name: org.name, slug: org.slug }, actor }, transaction)
    await audit(event, { orgId: org.id, action: 'member.add', objectType: 'user', objectId: user.id, detail: { role: 'admin', via: 'sign-up' }, actor }, transaction)
    return user
  }).catch((error) => { throw error instanceof UniqueConstraintError ? alreadyRegistered() : error })
  await startSession(event, user)
  return describeMe(user)
}

// Only the holder of the link (the mailbox's owner) can see this, so saying it reveals nothing to anyone else.
function alreadyRegistered() {
  return apiError(409, 'name-taken', 'This address already has a Knotwork account. Sign in instead, or set a new password from the sign-in page.')
}
