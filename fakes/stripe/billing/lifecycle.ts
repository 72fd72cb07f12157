import { emit, previousAttributes, type Ctx } from '../context.ts'
import { clone, type Obj } from '../store.ts'
import { invoiceSubscription } from './invoices.ts'

const LIVE = ['active', 'past_due', 'trialing', 'unpaid', 'incomplete']

/** A subscription follows its latest invoice: paid → active (or trialing), failed → past_due (incomplete stays incomplete). */
export function afterInvoicePayment(ctx: Ctx, inv: Obj, paid: boolean): void {
  const subId = invoiceSubscription(inv)
  const sub = subId ? ctx.store.get('subscriptions', subId) : undefined
  if (!sub || sub.latest_invoice !== inv.id || !LIVE.includes(sub.status)) return
  const before = clone(sub)
  if (paid) {
    if (['incomplete', 'past_due', 'unpaid'].includes(sub.status)) sub.status = sub.trial_end && sub.trial_end > ctx.now() ? 'trialing' : 'active'
  } else if (sub.status === 'active' || sub.status === 'trialing') {
    sub.status = 'past_due'
  }
  const prev = previousAttributes(before, sub)
  if (prev && !ctx.quiet.has(sub.id)) emit(ctx, 'customer.subscription.updated', sub, prev)
}

export function cancelSubscriptionNow(ctx: Ctx, sub: Obj, reason = 'cancellation_requested', at = ctx.now()): void {
  Object.assign(sub, {
    status: 'canceled', canceled_at: sub.canceled_at ?? at, ended_at: at, cancel_at_period_end: false,
    cancellation_details: { ...sub.cancellation_details, reason },
  })
  emit(ctx, 'customer.subscription.deleted', sub)
}
