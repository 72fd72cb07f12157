import type { BillingStatusDto } from '#shared/types/api'
import { billingStatus } from '~~/server/services/billing'

// The stored billing status, for the failed-payment banner (local read, no Stripe call).
export default defineEventHandler(async (event): Promise<BillingStatusDto> => {
  const { org } = await requirePermission(event, 'members:manage')
  return billingStatus(org.id)
})
