import { passwordResetRequestSchema } from '#shared/schemas/password-reset'
import { requestPasswordReset } from '~~/server/services/password-reset'

const ANSWER = { ok: true, message: 'If an account uses this address, we have sent it a link to set a new password. The link works for one hour.' }

// The same 200 and the same words whether or not the address is registered.
export default defineEventHandler(async (event) => {
  const { email } = await readValidBody(event, passwordResetRequestSchema)
  await requestPasswordReset(event, email)
  return ANSWER
})
