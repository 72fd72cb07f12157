import type { H3Event } from 'h3'
import type { Transaction } from 'sequelize'
import type Stripe from 'stripe'
import { BillingAccount } from '../database/models'

const at = (unix: number | null | undefined) => (unix ? new Date(unix * 1000) : null)

/** The subscription this account follows: the one it names, else the newest that is not over. */
function pickSubscription(subs: Stripe.Subscription[], known: string | null): Stripe.Subscription | undefined {
  return subs.find(s => s.id === known)
    ?? subs.find(s => !['canceled', 'incomplete_expired'].includes(s.status))
    ?? subs[0]
}

/**
 * Re-reads the customer, its subscription and its invoices through the API and stores them, whatever event
 * (or none) prompted it, so events in any order, repeated or missed, converge on Stripe's current state.
 * Call inside the transaction that records the event or the change; the account row is locked first, so
 * concurrent syncs of one organisation run one after the other and the last to commit read the newest state.
 */
export async function syncBillingAccount(event: H3Event | null, orgId: string, t: Transaction, source: string, customerId?: string): Promise<BillingAccount> {
  const account = await BillingAccount.findByPk(orgId, { transaction: t, lock: t.LOCK.UPDATE })
  if (!account) throw new Error(`no billing account for organisation ${orgId}`)
  const cid = account.stripeCustomerId ?? customerId
  if (!cid) return account
  const stripe = useStripe()
  const customer = await stripe.customers.retrieve(cid, { expand: ['invoice_settings.default_payment_method'] })
  const subs = await stripe.subscriptions.list({ customer: cid, status: 'all', limit: 20 })
  const invoices = await stripe.invoices.list({ customer: cid, limit: 100 }).autoPagingToArray({ limit: 2000 })
  const sub = pickSubscription(subs.data, account.stripeSubscriptionId)
  const item = sub?.items.data[0]
  const card = !customer.deleted && typeof customer.invoice_settings.default_payment_method === 'object'
    ? customer.invoice_settings.default_payment_method?.card ?? null
    : null
  const before = { seats: account.seats, status: account.status }
  await account.update({
    stripeCustomerId: cid,
    stripeSubscriptionId: sub?.id ?? account.stripeSubscriptionId,
    seats: item?.quantity ?? account.seats,
    status: customer.deleted ? 'canceled' : sub?.status ?? account.status,
    currentPeriodEnd: at(item?.current_period_end),
    cardBrand: card?.brand ?? null,
    cardLast4: card?.last4 ?? null,
    syncedAt: new Date(),
  }, { transaction: t })
  for (const inv of invoices) {
    if (!inv.id || inv.status === 'draft') continue
    await useDb().query(`
      INSERT INTO invoices (org_id, stripe_invoice_id, number, status, billing_reason, amount_due, amount_paid, currency,
                            period_start, period_end, hosted_invoice_url, created)
      VALUES (:orgId, :id, :number, :status, :reason, :due, :paid, :currency, :start, :end, :url, :created)
      ON CONFLICT (stripe_invoice_id) DO UPDATE SET number = EXCLUDED.number, status = EXCLUDED.status,
        amount_due = EXCLUDED.amount_due, amount_paid = EXCLUDED.amount_paid, hosted_invoice_url = EXCLUDED.hosted_invoice_url,
        period_start = EXCLUDED.period_start, period_end = EXCLUDED.period_end, updated_at = now()`, {
      transaction: t,
      replacements: {
        orgId, id: inv.id, number: inv.number ?? null, status: inv.status ?? 'open', reason: inv.billing_reason ?? null,
        due: inv.amount_due, paid: inv.amount_paid, currency: inv.currency,
        // the service period: a subscription line's, else the invoice's own
        start: at(inv.lines.data[0]?.period.start ?? inv.period_start), end: at(inv.lines.data[0]?.period.end ?? inv.period_end),
        url: inv.hosted_invoice_url ?? null, created: at(inv.created),
      },
    })
  }
  if (before.seats !== account.seats || before.status !== account.status) {
    await audit(event, {
      orgId, action: 'billing.sync', objectType: 'billing-account', objectId: orgId,
      detail: { source, from: before, to: { seats: account.seats, status: account.status }, subscription: account.stripeSubscriptionId },
      ...(event ? {} : { actor: null }),
    }, t)
  }
  return account
}
