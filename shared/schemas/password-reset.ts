import { z } from '#shared/zod'
import { email, linkToken, newPassword } from './auth'

export const passwordResetRequestSchema = z.object({ email })

export const passwordResetConfirmSchema = z.object({
  token: linkToken,
  password: newPassword,
})
