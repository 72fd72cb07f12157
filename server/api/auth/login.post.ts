import { loginSchema } from '#shared/schemas/auth'
import { DUMMY_HASH, verifyPassword } from '~~/server/lib/password'
import { User } from '~~/server/database/models'
import { describeMe } from '~~/server/services/me'

export default defineEventHandler(async (event) => {
  const { email, password } = await readValidBody(event, loginSchema)
  const ip = clientAddress(event)
  const wait = await loginRetryAfter(email, ip)
  if (wait > 0) {
    setResponseHeader(event, 'retry-after', wait)
    await audit(event, { action: 'auth.sign-in', outcome: 'denied', detail: { email, reason: 'throttled' }, actor: null })
    throw apiError(429, 'rate-limited', `Too many failed sign-ins. Try again in ${Math.ceil(wait / 60)} minute(s).`)
  }
  const user = await User.findOne({ where: { email } })
  // Verify even for an unknown e-mail so both answers take the same time and say the same thing.
  const matches = await verifyPassword(user?.passwordHash ?? DUMMY_HASH, password)
  if (!user || !matches) {
    await recordLoginFailure(email, ip)
    await audit(event, { action: 'auth.sign-in', outcome: 'failed', detail: { email }, actor: null })
    throw apiError(401, 'wrong-credentials', 'That e-mail and password do not match an account. Check both and try again.')
  }
  await clearAccountFailures(email)
  await startSession(event, user)
  await audit(event, { action: 'auth.sign-in', objectType: 'user', objectId: user.id })
  return describeMe(user)
})
