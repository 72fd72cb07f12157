import { signupCompleteSchema } from '#shared/schemas/auth'
import { completeSignup } from '~~/server/services/signup'

// Public, with the e-mailed link's token: creates the organisation with the person as its administrator, signed in.
export default defineEventHandler(async (event) => {
  const input = await readValidBody(event, signupCompleteSchema)
  const me = await completeSignup(event, input)
  setResponseStatus(event, 201)
  return me
})
