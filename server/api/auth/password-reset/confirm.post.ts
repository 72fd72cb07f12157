import { passwordResetConfirmSchema } from '#shared/schemas/password-reset'
import { confirmPasswordReset } from '~~/server/services/password-reset'

// Sets a new password from an e-mailed link; ends every session of that person.
export default defineEventHandler(async (event) => {
  const { token, password } = await readValidBody(event, passwordResetConfirmSchema)
  await confirmPasswordReset(event, token, password)
  return { ok: true }
})
