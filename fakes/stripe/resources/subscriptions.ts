import { emit, type Ctx } from '../context.ts'
import { invalid } from '../errors.ts'
import { listResponse, createdFilter } from '../list.ts'
import { allowOnly, optBool, optObject, optString } from '../params.ts'
import { resourceRoutes, type Route } from '../route.ts'
import type { Obj } from '../store.ts'
import { newInvoiceItem, pullPendingItems } from '../billing/invoice_items.ts'
import { finalizeInvoice, newInvoice } from '../billing/invoices.ts'
import { cancelSubscriptionNow } from '../billing/lifecycle.ts'
import { formatDate } from '../billing/money.ts'
import { attemptPayment } from '../billing/payment.ts'
import { prorate } from '../billing/proration.ts'
import { createSubscription } from '../billing/subscription_create.ts'
import { productName } from '../billing/subscription_parts.ts'
import { updateSubscription } from '../billing/subscription_update.ts'

/** Immediate cancel; `prorate` credits unused time, `invoice_now` bills pending items at once. */
function cancel(ctx: Ctx): Obj {
  allowOnly(ctx.body, ['invoice_now', 'prorate', 'cancellation_details'])
  const sub = ctx.store.require('subscriptions', ctx.params.id!, 'subscription')
  if (['canceled', 'incomplete_expired'].includes(sub.status)) throw invalid(`This subscription is already ${sub.status}.`, undefined, 'resource_missing')
  const details = optObject(ctx.body, 'cancellation_details')
  if (details) {
    allowOnly(details, ['comment', 'feedback'])
    sub.cancellation_details = { ...sub.cancellation_details, comment: details.comment || null, feedback: details.feedback || null }
  }
  const now = ctx.now()
  if (optBool(ctx.body, 'prorate') && sub.status !== 'trialing') {
    for (const item of sub.items.data) {
      const amount = prorate(item.price.unit_amount, item.quantity, item.current_period_start, item.current_period_end, now)
      if (amount) newInvoiceItem(ctx, {
        customer: sub.customer, currency: sub.currency, amount: -amount, price: item.price, quantity: item.quantity,
        period: { start: now, end: item.current_period_end }, subscription: sub.id, subscriptionItem: item.id, proration: true,
        description: `Unused time on ${item.quantity} × ${productName(ctx, item.price)} after ${formatDate(now)}`,
      })
    }
  }
  cancelSubscriptionNow(ctx, sub)
  if (optBool(ctx.body, 'invoice_now')) {
    const inv = newInvoice(ctx, ctx.store.get('customers', sub.customer)!, { subscription: sub, billingReason: 'subscription_update', currency: sub.currency, periodStart: now, periodEnd: now })
    pullPendingItems(ctx, inv, sub.id)
    emit(ctx, 'invoice.created', inv)
    finalizeInvoice(ctx, inv)
    if (inv.status === 'open') attemptPayment(ctx, inv)
  }
  return sub
}

function list(ctx: Ctx): Obj {
  allowOnly(ctx.body, ['customer', 'price', 'status', 'limit', 'starting_after', 'ending_before', 'created'])
  const customer = optString(ctx.body, 'customer')
  const price = optString(ctx.body, 'price')
  const status = optString(ctx.body, 'status')
  const created = createdFilter(ctx.body)
  const items = ctx.store.all('subscriptions').filter((s) => (!customer || s.customer === customer)
    && (!price || s.items.data.some((i: Obj) => i.price.id === price)) && created(s)
    && (status === 'all' || (status === 'ended' ? ['canceled', 'incomplete_expired'].includes(s.status) : status ? s.status === status : s.status !== 'canceled')))
  return listResponse(items, ctx.body, '/v1/subscriptions')
}

export const routes: Route[] = [
  ...resourceRoutes('/v1/subscriptions', { create: createSubscription, list, retrieve: (ctx) => ctx.store.require('subscriptions', ctx.params.id!, 'subscription'), update: updateSubscription, remove: cancel }),
]
