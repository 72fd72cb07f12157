import { passwordChangeSchema } from '#shared/schemas/auth'
import { changePassword } from '~~/server/services/auth'

// Changing the password ends every other session at once and re-issues this one.
export default defineEventHandler(async (event) => {
  const me = await requireUser(event)
  const input = await readValidBody(event, passwordChangeSchema)
  await changePassword(event, me, input)
  return { ok: true }
})
