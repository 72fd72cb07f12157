import type { H3Event } from 'h3'
import type { LoginInput, PasswordChangeInput } from '#shared/schemas/auth'
import type { MeDto } from '#shared/types/api'
import { User } from '../database/models'
import { DUMMY_HASH, hashPassword, verifyPassword } from '../lib/password'
import { describeMe } from './me'

/**
 * Checks a password against an account's hash under the throttles: the attempt takes a slot on the account and on the
 * client address BEFORE the hash runs (server/utils/throttle.ts), so concurrent guesses cannot outrun the count; the
 * right password gives the slots back. With no account (`hash` null) the same work runs against a dummy hash.
 */
export async function checkPassword(event: H3Event, email: string, hash: string | null, password: string, what: string): Promise<boolean> {
  const held = await holdAttempt(event, [accountRule(email), addressRule(clientAddress(event))], what)
  const matches = await verifyPassword(hash ?? DUMMY_HASH, password)
  if (matches && hash) await held.release()
  return matches && !!hash
}

/** Signs a person in with a fresh session; 401 with the same words for an unknown address and a wrong password. */
export async function signIn(event: H3Event, { email, password }: LoginInput): Promise<MeDto> {
  const user = await User.findOne({ where: { email } })
  let matches: boolean
  try {
    matches = await checkPassword(event, email, user?.passwordHash ?? null, password, 'Too many failed sign-ins')
  } catch (error) {
    await audit(event, { action: 'auth.sign-in', outcome: 'denied', detail: { email, reason: 'throttled' }, actor: null })
    throw error
  }
  if (!user || !matches) {
    await audit(event, { action: 'auth.sign-in', outcome: 'failed', detail: { email }, actor: null })
    throw apiError(401, 'wrong-credentials', 'That e-mail and password do not match an account. Check both and try again.')
  }
  await startSession(event, user)
  await audit(event, { action: 'auth.sign-in', objectType: 'user', objectId: user.id })
  return describeMe(user)
}

/** Ends this session on the server and deletes its cookie. */
export async function signOut(event: H3Event): Promise<void> {
  const session = await readSession(event)
  if (session?.sid && session.user) {
    await revokeSession(session.sid, 'signed out')
    await audit(event, { action: 'auth.sign-out', objectType: 'session', objectId: session.sid, actor: { id: session.user.id, email: session.user.email } })
  }
  await endSession(event)
}

/** Changes the password after checking the current one (throttled like a sign-in); every other session ends. */
export async function changePassword(event: H3Event, me: { user: { id: string }; sessionId: string }, input: PasswordChangeInput): Promise<void> {
  const user = await User.findByPk(me.user.id)
  if (!user) throw apiError(401, 'sign-in-required', 'Sign in to continue.')
  if (!(await checkPassword(event, user.email, user.passwordHash, input.currentPassword, 'Too many wrong passwords for this account'))) {
    await audit(event, { action: 'auth.password-change', outcome: 'failed', objectType: 'user', objectId: user.id })
    throw apiError(400, 'wrong-password', 'The current password is not right.', { field: 'currentPassword' })
  }
  await user.update({ passwordHash: await hashPassword(input.newPassword), passwordChangedAt: new Date() })
  await revokeSessions(user.id, 'password changed')
  await startSession(event, user)
  await audit(event, { action: 'auth.password-change', objectType: 'user', objectId: user.id, detail: { previousSession: me.sessionId } })
}
