import { z } from '#shared/zod'
import { ROLES } from '../permissions'
import { email, newPassword } from './auth'

// Forms of the members and billing pages and the invitation page; the handlers validate the same objects.
export const role = z.enum(ROLES, { message: 'Choose a role' })

export const inviteSchema = z.object({ email, role })
export const roleChangeSchema = z.object({ role })

export const seatsSchema = z.object({
  seats: z.coerce.number({ message: 'Enter a number of seats' }).int({ message: 'Enter a whole number of seats' })
    .min(1, { message: 'Keep at least 1 seat' }).max(500, { message: 'For more than 500 seats, write to us' }),
  // the form's own key, so a repeated submit does not change the subscription twice
  requestKey: z.uuid().optional(),
  // the moment the confirmed preview was priced at (unix seconds): the change is prorated from exactly then
  prorationDate: z.number().int().positive().optional(),
})

/** Asking what a change of seats will cost, before confirming it. */
export const seatsPreviewSchema = seatsSchema.pick({ seats: true })

export const acceptNewAccountSchema = z.object({
  name: z.string().trim().min(1, { message: 'Enter your name' }).max(120),
  password: newPassword,
})
export const acceptExistingAccountSchema = z.object({
  password: z.string().min(1, { message: 'Enter your password' }).max(200),
})

export type InviteInput = z.infer<typeof inviteSchema>
export type SeatsInput = z.infer<typeof seatsSchema>
