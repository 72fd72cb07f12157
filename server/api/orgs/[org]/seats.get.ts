import type { SeatsDto } from '#shared/types/api'
import { ensureBillingAccount, seatUsage } from '~~/server/services/seats'

// Seats used (members + open invitations) and purchased; read locally, never from Stripe.
export default defineEventHandler(async (event): Promise<SeatsDto> => {
  const { org } = await requirePermission(event, 'members:manage')
  const account = await ensureBillingAccount(org.id)
  return seatUsage(org.id, account.seats)
})
