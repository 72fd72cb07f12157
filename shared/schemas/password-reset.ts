import { z } from 'zod'
import { email, newPassword } from './auth'

export const passwordResetRequestSchema = z.object({ email })

export const passwordResetConfirmSchema = z.object({
  token: z.string().regex(/^[A-Za-z0-9_-]{22}$/, { message: 'This reset link is not valid' }),
  password: newPassword,
})
