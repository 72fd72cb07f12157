import type { BillingStatusDto } from '#shared/types/api'
import { BillingAccount } from '~~/server/database/models'
import { ATTENTION_STATUSES } from '~~/server/services/billing'

// The stored billing status, for the failed-payment banner (local read, no Stripe call).
export default defineEventHandler(async (event): Promise<BillingStatusDto> => {
  const { org } = await requirePermission(event, 'members:manage')
  const status = (await BillingAccount.findByPk(org.id))?.status ?? 'not_started'
  return { status, attention: ATTENTION_STATUSES.includes(status) }
})
