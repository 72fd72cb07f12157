import type { Ctx } from '../context.ts'
import { invalid } from '../errors.ts'
import { allowOnly, optEnum, optInt, optObject, optString } from '../params.ts'
import { clone, type Obj } from '../store.ts'
import { pullPendingItems } from './invoice_items.ts'
import { addCycleLine, newInvoice, recomputeTotals } from './invoices.ts'
import { nextBoundary } from './periods.ts'
import { productName } from './subscription_parts.ts'
import { PRORATION_BEHAVIOURS, updateSubscription } from './subscription_update.ts'

/**
 * `POST /v1/invoices/create_preview` for a change to a subscription (Stripe's "Create a preview invoice"): the change is
 * applied to a copy of the state with the same code as a real update, the invoice it would produce is read, and the state
 * is put back, so nothing is stored and no event is sent. With `proration_behavior=always_invoice` the preview is the
 * invoice the update creates at once (its proration lines); otherwise it is the next renewal invoice with the pending
 * prorations. Pass the same `proration_date` to the update and it charges exactly the previewed amount. The preview's id
 * starts with `upcoming_` and it appears in no list, as in Stripe.
 */
export function previewInvoice(ctx: Ctx): Obj {
  const b = ctx.body
  allowOnly(b, ['customer', 'subscription', 'subscription_details'])
  const subId = optString(b, 'subscription')
  if (!subId) throw invalid('The local Stripe fake previews changes to an existing subscription only: pass subscription.', 'subscription', 'parameter_missing')
  const sub = ctx.store.require('subscriptions', subId, 'subscription', 'subscription')
  const customerId = optString(b, 'customer')
  if (customerId && customerId !== sub.customer) throw invalid(`The subscription ${subId} does not belong to the customer ${customerId}.`, 'customer')
  const details = optObject(b, 'subscription_details') ?? {}
  allowOnly(details, ['items', 'proration_behavior', 'proration_date'])
  const behaviour = optEnum(details, 'proration_behavior', PRORATION_BEHAVIOURS, 'subscription_details[proration_behavior]') ?? 'create_prorations'
  const at = optInt(details, 'proration_date', 'subscription_details[proration_date]') ?? ctx.now()
  const snapshot = ctx.store.snapshot()
  try {
    // the update as it would run, but creating prorations only (the invoice is assembled below, never issued)
    const sim: Ctx = { ...ctx, events: [], quiet: new Set(), params: { id: sub.id }, body: { ...(details.items ? { items: details.items } : {}), proration_behavior: behaviour === 'none' ? 'none' : 'create_prorations', proration_date: String(at) } }
    const updated = updateSubscription(sim)
    const customer = ctx.store.get('customers', updated.customer)!
    const first = updated.items.data[0]
    const end = first.current_period_end
    const immediate = behaviour === 'always_invoice'
    const inv = newInvoice(sim, customer, { subscription: updated, billingReason: immediate ? 'subscription_update' : 'upcoming', currency: updated.currency, periodStart: immediate ? at : first.current_period_start, periodEnd: immediate ? at : end })
    if (!immediate) {
      const next = nextBoundary(updated.billing_cycle_anchor, first.price.recurring.interval, first.price.recurring.interval_count, end)
      for (const item of updated.items.data) addCycleLine(inv, updated, item, productName(sim, item.price), end, next, updated.status === 'trialing' && updated.trial_end && updated.trial_end > end)
    }
    pullPendingItems(sim, inv, updated.id)
    if (immediate) inv.parent.subscription_details.subscription_proration_date = at
    recomputeTotals(inv)
    const x = inv.total + customer.balance
    Object.assign(inv, { id: `upcoming_${inv.id}`, starting_balance: customer.balance, ending_balance: Math.min(0, x), amount_due: Math.max(0, x), amount_remaining: Math.max(0, x), auto_advance: false })
    for (const line of inv.lines.data) line.invoice = inv.id
    inv.lines.url = `/v1/invoices/${inv.id}/lines`
    return clone(inv)
  } finally {
    ctx.store.restore(snapshot)
  }
}
