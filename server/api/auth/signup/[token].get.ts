import { z } from 'zod'
import { linkToken } from '#shared/schemas/auth'
import { signupLink } from '~~/server/services/signup'

const params = z.object({ token: linkToken })

// Public: the address an e-mailed sign-up link was sent to; 400 when the link is used or expired.
export default defineEventHandler(async (event) => {
  const { token } = readValidParams(event, params)
  return signupLink(token)
})
