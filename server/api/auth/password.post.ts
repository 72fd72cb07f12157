import { passwordChangeSchema } from '#shared/schemas/auth'
import { hashPassword, verifyPassword } from '~~/server/lib/password'
import { User } from '~~/server/database/models'

// Changing the password ends every other session at once and re-issues this one.
export default defineEventHandler(async (event) => {
  const { user: me, sessionId } = await requireUser(event)
  const input = await readValidBody(event, passwordChangeSchema)
  const user = await User.findByPk(me.id)
  if (!user || !(await verifyPassword(user.passwordHash, input.currentPassword))) {
    throw apiError(400, 'wrong-password', 'The current password is not right.', { field: 'currentPassword' })
  }
  await user.update({ passwordHash: await hashPassword(input.newPassword), passwordChangedAt: new Date() })
  await revokeSessions(user.id, 'password changed')
  await startSession(event, user)
  await audit(event, { action: 'auth.password-change', objectType: 'user', objectId: user.id, detail: { previousSession: sessionId } })
  return { ok: true }
})
