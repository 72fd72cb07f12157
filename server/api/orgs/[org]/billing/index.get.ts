import type { BillingDto } from '#shared/types/api'
import { describeBilling } from '~~/server/services/billing'

// Plan, seats, status, card and invoices. The first call starts the Stripe customer and subscription.
export default defineEventHandler(async (event): Promise<BillingDto> => {
  const { org } = await requirePermission(event, 'members:manage')
  return describeBilling(event, org, appLink(`/orgs/${org.slug}/billing?card=saved`))
})
