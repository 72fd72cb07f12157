import { signupRequestSchema } from '#shared/schemas/auth'
import { requestSignup } from '~~/server/services/signup'

const ANSWER = { ok: true, message: 'We have sent a link to this address. Open it to name your organisation and choose a password; it works for 24 hours.' }

// Public. The same 202 and the same words whether or not the address is registered (server/services/signup.ts).
export default defineEventHandler(async (event) => {
  const { email } = await readValidBody(event, signupRequestSchema)
  await requestSignup(event, email)
  setResponseStatus(event, 202)
  return ANSWER
})
