import type { H3Event } from 'h3'
import { Op, type Transaction } from 'sequelize'
import { PasswordReset, User } from '../database/models'
import { hashPassword } from '../lib/password'
import { hashToken, newToken } from '../lib/tokens'
import { passwordResetMail } from './mail-templates'

const RESET_MINUTES = 60
const MAX_OPEN_RESETS = 5

/**
 * Asks for a reset link. Before answering, every request does the same work whatever the address (the throttles, per
 * client address and per address asked about); the lookup, the new link and the mail come after the answer
 * (afterAnswer), so neither the answer nor its timing says whether the address is registered.
 */
export async function requestPasswordReset(event: H3Event, email: string): Promise<void> {
  await holdAttempt(event, resetRules(clientAddress(event), email), 'Too many password-reset requests')
  afterAnswer(event, 'password-reset', () => startReset(event, email))
}

async function startReset(event: H3Event, email: string): Promise<void> {
  const user = await User.findOne({ where: { email } })
  if (!user) return
  const recent = await PasswordReset.count({ where: { userId: user.id, usedAt: null, expiresAt: { [Op.gt]: new Date() } } })
  if (recent >= MAX_OPEN_RESETS) return // bounds the mail one person can be sent
  const { token, hash } = newToken()
  await inTransaction(async (t) => {
    await PasswordReset.create({ userId: user.id, tokenHash: hash, expiresAt: new Date(Date.now() + RESET_MINUTES * 60_000) }, { transaction: t })
    await audit(event, { action: 'auth.password-reset-request', objectType: 'user', objectId: user.id, actor: null, detail: { email } }, t)
  })
  await sendMail(passwordResetMail(user.email, appLink(`/reset-password/${token}`)))
}

/** Sets the new password once per token; every open reset of the person is spent, all sessions end, and the account's
 * failed sign-ins are forgotten. */
export async function confirmPasswordReset(event: H3Event, token: string, password: string): Promise<void> {
  await openReset(token) // a link that does not work costs no hash
  const passwordHash = await hashPassword(password)
  const user = await inTransaction(async (t) => {
    const reset = await openReset(token, t)
    const user = (await User.findByPk(reset.userId, { transaction: t }))!
    await user.update({ passwordHash, passwordChangedAt: new Date() }, { transaction: t })
    await PasswordReset.update({ usedAt: new Date() }, { where: { userId: user.id, usedAt: null }, transaction: t })
    await audit(event, { action: 'auth.password-reset', objectType: 'user', objectId: user.id, actor: { id: user.id, email: user.email } }, t)
    return user
  })
  await revokeSessions(user.id, 'password reset')
  // the owner proved the mailbox: failed guesses by someone else no longer keep them out (a malicious lockout ends here)
  await clearThrottle(accountRule(user.email))
}

async function openReset(token: string, t?: Transaction): Promise<PasswordReset> {
  const reset = await PasswordReset.findOne({ where: { tokenHash: hashToken(token) }, transaction: t, ...(t ? { lock: t.LOCK.UPDATE } : {}) })
  if (!reset || reset.usedAt || reset.expiresAt.getTime() <= Date.now()) {
    throw apiError(400, 'link-expired', 'This reset link is not valid any more: it was used or it expired. Ask for a new one.')
  }
  return reset
}
