import { emit, previousAttributes, type Ctx } from '../context.ts'
import { clone, type Obj, type Store } from '../store.ts'
import { cancelSubscriptionNow } from './lifecycle.ts'
import { pullPendingItems } from './invoice_items.ts'
import { addCycleLine, finalizeInvoice, invoiceSubscription, newInvoice } from './invoices.ts'
import { attemptPayment } from './payment.ts'
import { nextBoundary } from './periods.ts'
import { productName } from './subscription_parts.ts'

const RENEWING = ['active', 'past_due', 'trialing', 'unpaid']
/** Stripe expires an unpaid first invoice's subscription after 23 hours. */
const INCOMPLETE_TTL = 23 * 3600

/** One billing period forward: items move to the next period, a `subscription_cycle` invoice is created and charged. */
function renewOnce(ctx: Ctx, sub: Obj): void {
  const before = clone(sub)
  const first = sub.items.data[0]
  const start = first.current_period_end
  const { interval, interval_count: count } = first.price.recurring
  const end = nextBoundary(sub.billing_cycle_anchor, interval, count, start)
  for (const item of sub.items.data) Object.assign(item, { current_period_start: start, current_period_end: end })
  if (sub.status === 'trialing') sub.status = 'active'
  ctx.quiet.add(sub.id)
  const customer = ctx.store.get('customers', sub.customer)!
  const inv = newInvoice(ctx, customer, { subscription: sub, billingReason: 'subscription_cycle', currency: sub.currency, periodStart: before.items.data[0].current_period_start, periodEnd: start })
  for (const item of sub.items.data) addCycleLine(inv, sub, item, productName(ctx, item.price), start, end)
  pullPendingItems(ctx, inv, sub.id)
  sub.latest_invoice = inv.id
  emit(ctx, 'invoice.created', inv)
  finalizeInvoice(ctx, inv)
  if (inv.status === 'open') attemptPayment(ctx, inv)
  ctx.quiet.delete(sub.id)
  const prev = previousAttributes(before, sub)
  if (prev) emit(ctx, 'customer.subscription.updated', sub, prev)
}

function expireIncomplete(ctx: Ctx, sub: Obj): void {
  const before = clone(sub)
  const inv = sub.latest_invoice ? ctx.store.get('invoices', sub.latest_invoice) : undefined
  if (inv?.status === 'open') {
    Object.assign(inv, { status: 'void', amount_remaining: 0, next_payment_attempt: null })
    inv.status_transitions.voided_at = ctx.now()
    emit(ctx, 'invoice.voided', inv)
  }
  Object.assign(sub, { status: 'incomplete_expired', ended_at: ctx.now() })
  emit(ctx, 'customer.subscription.updated', sub, previousAttributes(before, sub))
}

/** After the last dunning retry fails: FAKE_STRIPE_DUNNING_FINAL = cancel (default) | unpaid | past_due. */
function afterLastRetry(ctx: Ctx, inv: Obj): void {
  const subId = invoiceSubscription(inv)
  const sub = subId ? ctx.store.get('subscriptions', subId) : undefined
  if (!sub || !RENEWING.includes(sub.status)) return
  const action = process.env.FAKE_STRIPE_DUNNING_FINAL ?? 'cancel'
  if (action === 'cancel') cancelSubscriptionNow(ctx, sub, 'payment_failed')
  else if (action === 'unpaid' && sub.status !== 'unpaid') {
    const before = clone(sub)
    sub.status = 'unpaid'
    emit(ctx, 'customer.subscription.updated', sub, previousAttributes(before, sub))
  }
}

/** Cheap check so that most requests skip the renewal transaction. */
export function hasDueWork(store: Store, now: number): boolean {
  return store.all('subscriptions').some((s) => (s.status === 'incomplete' && now >= s.created + INCOMPLETE_TTL)
    || (RENEWING.includes(s.status) && s.items.data[0].current_period_end <= now))
    || store.all('invoices').some((i) => i.status === 'open' && i.next_payment_attempt && i.next_payment_attempt <= now)
}

/** Everything that is due at the fake's current time: expiries, cancellations at period end, renewals, retries. */
export function runDueWork(ctx: Ctx): void {
  const now = ctx.now()
  for (const sub of ctx.store.all('subscriptions').reverse()) {
    if (sub.status === 'incomplete' && now >= sub.created + INCOMPLETE_TTL) { expireIncomplete(ctx, sub); continue }
    for (let guard = 0; guard < 1200 && RENEWING.includes(sub.status); guard++) {
      const end = sub.items.data[0].current_period_end
      if (end > now) break
      if (sub.cancel_at_period_end || (sub.cancel_at && sub.cancel_at <= end)) { cancelSubscriptionNow(ctx, sub, 'cancellation_requested', end); break }
      renewOnce(ctx, sub)
    }
  }
  for (const inv of ctx.store.all('invoices').reverse()) {
    if (inv.status !== 'open' || !inv.next_payment_attempt || inv.next_payment_attempt > now) continue
    const err = attemptPayment(ctx, inv)
    if (err && inv.next_payment_attempt === null) afterLastRetry(ctx, inv)
  }
}
