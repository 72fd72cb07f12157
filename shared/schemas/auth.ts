import { z } from 'zod'

// One schema per form, imported by the page (vee-validate) and the handler (readValidatedBody).
export const email = z.string().trim().toLowerCase().pipe(z.email({ message: 'Enter an e-mail address like name@example.com' }))
// NIST SP 800-63B: at least 8 characters; we ask for 12 and cap at 200 to bound hashing work.
export const newPassword = z.string()
  .min(12, { message: 'Use at least 12 characters' })
  .max(200, { message: 'Use at most 200 characters' })

export const loginSchema = z.object({
  email,
  password: z.string().min(1, { message: 'Enter your password' }).max(200),
})

export const signupSchema = z.object({
  name: z.string().trim().min(1, { message: 'Enter your name' }).max(120),
  email,
  password: newPassword,
  organisation: z.string().trim().min(2, { message: 'Enter your organisation\u2019s name' }).max(120),
})

export const passwordChangeSchema = z.object({
  currentPassword: z.string().min(1, { message: 'Enter your current password' }).max(200),
  newPassword,
}).refine(v => v.currentPassword !== v.newPassword, {
  message: 'Choose a password different from the current one',
  path: ['newPassword'],
})

export type LoginInput = z.infer<typeof loginSchema>
export type SignupInput = z.infer<typeof signupSchema>
export type PasswordChangeInput = z.infer<typeof passwordChangeSchema>
