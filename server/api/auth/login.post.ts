import { loginSchema } from '#shared/schemas/auth'
import { signIn } from '~~/server/services/auth'

// Public. Throttled per account and per client address before the password hash runs (server/services/auth.ts).
export default defineEventHandler(async (event) => {
  const input = await readValidBody(event, loginSchema)
  return signIn(event, input)
})
