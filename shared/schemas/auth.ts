import { z } from '#shared/zod'

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

// Sign-up in two steps: the address first (the same answer whether or not it is registered), then, from the e-mailed
// link, the organisation, the person's name and the password.
export const signupRequestSchema = z.object({ email })

export const signupDetailsSchema = z.object({
  organisation: z.string().trim().min(2, { message: 'Enter your organisation\u2019s name' }).max(120),
  name: z.string().trim().min(1, { message: 'Enter your name' }).max(120),
  password: newPassword,
})

export const linkToken = z.string().regex(/^[A-Za-z0-9_-]{22}$/, { message: 'This link is not valid' })
export const signupCompleteSchema = signupDetailsSchema.extend({ token: linkToken })

export const passwordChangeSchema = z.object({
  currentPassword: z.string().min(1, { message: 'Enter your current password' }).max(200),
  newPassword,
}).refine(v => v.currentPassword !== v.newPassword, {
  message: 'Choose a password different from the current one',
  path: ['newPassword'],
})

export type LoginInput = z.infer<typeof loginSchema>
export type SignupDetails = z.infer<typeof signupDetailsSchema>
export type SignupComplete = z.infer<typeof signupCompleteSchema>
export type PasswordChangeInput = z.infer<typeof passwordChangeSchema>
