import type { H3Event } from 'h3'
import type { BillingDto, BillingInvoiceDto, BillingStatusDto, SeatsPreviewDto } from '#shared/types/api'
import { BillingAccount, BillingInvoice, type Organisation } from '../database/models'
import { PLAN, TRIAL_DAYS, planPriceId } from './billing-plan'
import { syncBillingAccount } from './billing-sync'
import { ensureBillingAccount, seatUsage } from './seats'

/**
 * Creates the organisation's Stripe customer and subscription the first time billing is needed (billing page or an
 * invitation), so sign-up never depends on Stripe. Every call is idempotent by organisation; the ids are stored by
 * the sync that follows (which also finds them by customer if a webhook got there first).
 */
export async function provisionBilling(event: H3Event, org: Organisation): Promise<BillingAccount> {
  const account = await ensureBillingAccount(org.id)
  if (account.stripeSubscriptionId) return account
  const stripe = useStripe()
  try {
    const customer = account.stripeCustomerId
      ? { id: account.stripeCustomerId }
      : await stripe.customers.create({ name: org.name, metadata: { org_id: org.id, org_slug: org.slug } }, { idempotencyKey: `kw-customer-${org.id}` })
    // Demo organisations get Stripe's documented test card, and only with a test key.
    const demoCard = account.demoCard && String(useRuntimeConfig().stripeSecretKey).startsWith('sk_test_')
    if (demoCard) {
      const pm = await stripe.paymentMethods.attach('pm_card_visa', { customer: customer.id }, { idempotencyKey: `kw-demo-card-${org.id}` })
      await stripe.customers.update(customer.id, { invoice_settings: { default_payment_method: pm.id } })
    }
    await stripe.subscriptions.create({
      customer: customer.id,
      items: [{ price: await planPriceId(stripe), quantity: account.seats }],
      metadata: { org_id: org.id },
      ...(demoCard ? {} : { trial_period_days: TRIAL_DAYS }),
    }, { idempotencyKey: `kw-subscription-${org.id}` })
    return await inTransaction(async (t) => {
      const synced = await syncBillingAccount(event, org.id, t, 'provision', customer.id)
      await audit(event, { orgId: org.id, action: 'billing.start', objectType: 'billing-account', objectId: org.id,
        detail: { customer: synced.stripeCustomerId, subscription: synced.stripeSubscriptionId, seats: synced.seats, status: synced.status } }, t)
      return synced
    })
  } catch (error) {
    stripeFailure(error)
  }
}

async function seatsAccount(event: H3Event, org: Organisation, seats: number): Promise<BillingAccount> {
  const account = await provisionBilling(event, org)
  const usage = await seatUsage(org.id, account.seats)
  if (seats < usage.used) {
    throw apiError(409, 'seats-in-use', `${usage.used} seats are in use (${usage.members} members, ${usage.pending} open invitations). Remove people or cancel invitations before going below that.`)
  }
  return account
}

/** A preview priced at most this long ago may be confirmed as it is; an older one is priced again. */
const PREVIEW_VALID_S = 3600

/** What changing the seats will charge now, from the payment service's own preview of the proration invoice. */
export async function previewSeats(event: H3Event, org: Organisation, seats: number): Promise<SeatsPreviewDto> {
  const account = await seatsAccount(event, org, seats)
  const stripe = useStripe()
  try {
    const sub = await stripe.subscriptions.retrieve(account.stripeSubscriptionId!)
    const item = sub.items.data[0]!
    const prorationDate = Math.floor(Date.now() / 1000)
    const invoice = await stripe.invoices.createPreview({
      customer: sub.customer as string, subscription: sub.id,
      subscription_details: { items: [{ id: item.id, quantity: seats }], proration_behavior: 'always_invoice', proration_date: prorationDate },
    })
    return {
      from: item.quantity ?? account.seats, to: seats, amountDue: invoice.amount_due, prorated: invoice.total, currency: invoice.currency, prorationDate,
      periodEnd: item.current_period_end ? new Date(item.current_period_end * 1000).toISOString() : null, monthlyAfter: PLAN.unitAmount * seats,
      card: account.cardBrand && account.cardLast4 ? { brand: account.cardBrand, last4: account.cardLast4 } : null, trial: sub.status === 'trialing',
    }
  } catch (error) {
    stripeFailure(error)
  }
}

/**
 * Changes the subscription quantity; the proration is invoiced at once. Refuses fewer seats than are in use. With the
 * preview's prorationDate (at most an hour old), the charge is exactly the amount the person confirmed.
 */
export async function changeSeats(event: H3Event, org: Organisation, seats: number, requestKey: string, prorationDate?: number): Promise<void> {
  const account = await seatsAccount(event, org, seats)
  if (seats === account.seats) return
  if (prorationDate !== undefined && (prorationDate < Date.now() / 1000 - PREVIEW_VALID_S || prorationDate > Date.now() / 1000 + 60)) {
    throw apiError(409, 'reload-needed', 'The amount you confirmed was worked out more than an hour ago. Ask for the price again before changing the seats.')
  }
  const stripe = useStripe()
  try {
    const sub = await stripe.subscriptions.retrieve(account.stripeSubscriptionId!)
    const item = sub.items.data[0]!
    if (item.quantity !== seats) {
      await stripe.subscriptions.update(sub.id, { items: [{ id: item.id, quantity: seats }], proration_behavior: 'always_invoice', ...(prorationDate ? { proration_date: prorationDate } : {}) },
        { idempotencyKey: `kw-seats-${org.id}-${requestKey}` })
    }
    await inTransaction(async (t) => {
      const before = account.seats
      const synced = await syncBillingAccount(event, org.id, t, 'seat-change')
      await audit(event, { orgId: org.id, action: 'billing.seats-change', objectType: 'billing-account', objectId: org.id,
        detail: { from: before, to: seats, stored: synced.seats, status: synced.status, idempotencyKey: `kw-seats-${org.id}-${requestKey}` } }, t)
    })
  } catch (error) {
    stripeFailure(error)
  }
}

/** Re-reads billing from Stripe (best effort) and describes it; on a connection failure the stored figures are shown. */
export async function describeBilling(event: H3Event, org: Organisation, returnUrl: string): Promise<BillingDto> {
  let stale = false
  let account: BillingAccount
  try {
    account = await provisionBilling(event, org)
    account = await inTransaction(t => syncBillingAccount(event, org.id, t, 'billing-page'))
  } catch (error) {
    if (![502, 503].includes((error as { statusCode?: number }).statusCode ?? 0)) throw error
    stale = true
    account = await ensureBillingAccount(org.id)
  }
  const invoices = await BillingInvoice.findAll({ where: { orgId: org.id }, order: [['created', 'DESC']], limit: 100 })
  return {
    plan: { name: PLAN.name, unitAmount: PLAN.unitAmount, currency: PLAN.currency, interval: PLAN.interval },
    seats: await seatUsage(org.id, account.seats),
    status: account.status,
    currentPeriodEnd: account.currentPeriodEnd?.toISOString() ?? null,
    card: account.cardBrand && account.cardLast4 ? { brand: account.cardBrand, last4: account.cardLast4 } : null,
    cardEntryUrl: account.stripeCustomerId ? cardEntryUrl(account.stripeCustomerId, returnUrl) : null,
    invoices: invoices.map(toInvoiceDto),
    syncedAt: account.syncedAt?.toISOString() ?? null,
    stale,
  }
}

function toInvoiceDto(i: BillingInvoice): BillingInvoiceDto {
  return {
    id: i.stripeInvoiceId, number: i.number, status: i.status, reason: i.billingReason,
    amountDue: Number(i.amountDue), amountPaid: Number(i.amountPaid), currency: i.currency,
    periodStart: i.periodStart?.toISOString() ?? null, periodEnd: i.periodEnd?.toISOString() ?? null,
    created: i.created.toISOString(), hostedUrl: i.hostedInvoiceUrl,
  }
}

/** Billing states that need the administrator's attention (a payment failed). */
export const ATTENTION_STATUSES = ['past_due', 'unpaid', 'incomplete']

/** The stored billing status, for the failed-payment banner (a local read, no Stripe call). */
export async function billingStatus(orgId: string): Promise<BillingStatusDto> {
  const status = (await BillingAccount.findByPk(orgId))?.status ?? 'not_started'
  return { status, attention: ATTENTION_STATUSES.includes(status) }
}
