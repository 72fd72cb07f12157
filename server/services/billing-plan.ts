import type Stripe from 'stripe'

// One plan: "Knotwork Team", billed monthly per seat. Prices live in Stripe; the app finds the price by lookup key.
export const PLAN = { name: 'Knotwork Team', lookupKey: 'knotwork-team-monthly-eur', unitAmount: 4900, currency: 'eur', interval: 'month' } as const
export const NEW_ORG_SEATS = 3
export const DEMO_ORG_SEATS = 5
export const TRIAL_DAYS = 14

let priceId: string | undefined

/** The plan's price id: found by lookup key, or created once (idempotent). */
export async function planPriceId(stripe: Stripe): Promise<string> {
  if (priceId) return priceId
  const found = await stripe.prices.list({ lookup_keys: [PLAN.lookupKey], active: true, limit: 1 })
  const price = found.data[0] ?? await stripe.prices.create({
    currency: PLAN.currency,
    unit_amount: PLAN.unitAmount,
    recurring: { interval: PLAN.interval },
    product_data: { name: PLAN.name, unit_label: 'seat' },
    lookup_key: PLAN.lookupKey,
    nickname: `${PLAN.name}, monthly per seat`,
  }, { idempotencyKey: `kw-price-${PLAN.lookupKey}-v1` })
  priceId = price.id
  return price.id
}
