import { emit, previousAttributes, type Ctx } from '../context.ts'
import { invalid, missing } from '../errors.ts'
import { allowOnly, applyMetadata, listParam, optBool, optEnum, optInt, optNullableString, optString } from '../params.ts'
import { clone, type Obj } from '../store.ts'
import { newInvoiceItem, pullPendingItems } from './invoice_items.ts'
import { newInvoice } from './invoices.ts'
import { formatDate } from './money.ts'
import { prorate } from './proration.ts'
import { PAYMENT_BEHAVIOURS } from './subscription_create.ts'
import { attachedPaymentMethod, issueSubscriptionInvoice, newSubscriptionItem, planOf, productName, recurringPrice, sameBillingTerms } from './subscription_parts.ts'

export const PRORATION_BEHAVIOURS = ['create_prorations', 'always_invoice', 'none'] as const
interface Change { item: Obj; old: { price: Obj; quantity: number } | null; next: { price: Obj; quantity: number } | null }

function applyItemChanges(ctx: Ctx, sub: Obj): Change[] {
  const changes: Change[] = []
  const { current_period_start: start, current_period_end: end } = sub.items.data[0]
  listParam(ctx.body.items, 'items').forEach((it: Obj, i: number) => {
    allowOnly(it, ['id', 'price', 'quantity', 'deleted', 'metadata'])
    const param = `items[${i}]`
    const priceId = optString(it, 'price', `${param}[price]`)
    const price = priceId ? recurringPrice(ctx, priceId, `${param}[price]`) : undefined
    if (price) sameBillingTerms(sub.items.data[0].price, price, `${param}[price]`)
    const quantity = optInt(it, 'quantity', `${param}[quantity]`, 0)
    const id = optString(it, 'id', `${param}[id]`)
    if (!id) {
      if (!price) throw invalid(`Missing required param: ${param}[price].`, `${param}[price]`, 'parameter_missing')
      const item = newSubscriptionItem(ctx, sub.id, price, quantity ?? 1, start, end)
      item.metadata = applyMetadata({}, it.metadata)
      sub.items.data.push(item)
      changes.push({ item, old: null, next: { price, quantity: item.quantity } })
      return
    }
    const item = sub.items.data.find((x: Obj) => x.id === id)
    if (!item) throw invalid(`No such subscription item: '${id}'`, `${param}[id]`, 'resource_missing')
    const old = { price: item.price, quantity: item.quantity }
    item.metadata = applyMetadata(item.metadata, it.metadata)
    if (optBool(it, 'deleted', `${param}[deleted]`)) {
      sub.items.data = sub.items.data.filter((x: Obj) => x !== item)
      changes.push({ item, old, next: null })
      return
    }
    const next = { price: price ?? item.price, quantity: quantity ?? item.quantity }
    if (next.price.id === old.price.id && next.quantity === old.quantity) return
    Object.assign(item, { price: clone(next.price), plan: planOf(next.price), quantity: next.quantity })
    changes.push({ item, old, next })
  })
  if (!sub.items.data.length) throw invalid('A subscription must have at least one item. To end it, cancel the subscription.', 'items')
  sub.items.total_count = sub.items.data.length
  return changes
}

/** Credit for unused time on the old line and charge for remaining time on the new one (see proration.ts). */
function createProrations(ctx: Ctx, sub: Obj, changes: Change[], at: number): Obj[] {
  const { current_period_start: start, current_period_end: end } = sub.items.data[0] ?? changes[0]!.item
  const items: Obj[] = []
  const base = { customer: sub.customer, currency: sub.currency, period: { start: at, end }, subscription: sub.id, proration: true }
  for (const ch of changes) {
    for (const [side, sign, words] of [[ch.old, -1, 'Unused'], [ch.next, 1, 'Remaining']] as const) {
      if (!side) continue
      const amount = prorate(side.price.unit_amount, side.quantity, start, end, at)
      if (amount === 0) continue
      items.push(newInvoiceItem(ctx, {
        ...base, amount: sign * amount, price: side.price, quantity: side.quantity, subscriptionItem: ch.item.id,
        description: `${words} time on ${side.quantity} × ${productName(ctx, side.price)} after ${formatDate(at)}`,
      }))
    }
  }
  return items
}

export function updateSubscription(ctx: Ctx): Obj {
  const b = ctx.body
  allowOnly(b, ['items', 'proration_behavior', 'proration_date', 'payment_behavior', 'metadata', 'default_payment_method',
    'cancel_at_period_end', 'description', 'off_session'])
  const sub = ctx.store.require('subscriptions', ctx.params.id!, 'subscription')
  if (['canceled', 'incomplete_expired'].includes(sub.status)) {
    if (Object.keys(b).some((k) => k !== 'metadata' && k !== 'expand')) throw invalid('A canceled subscription can only update its cancellation_details and metadata.')
  }
  const before = clone(sub)
  const proration = optEnum(b, 'proration_behavior', PRORATION_BEHAVIOURS) ?? 'create_prorations'
  const behaviour = optEnum(b, 'payment_behavior', PAYMENT_BEHAVIOURS) ?? 'allow_incomplete'
  const { current_period_start: start, current_period_end: end } = sub.items.data[0]
  const at = optInt(b, 'proration_date') ?? ctx.now()
  if (at < start || at > end) throw invalid('proration_date must be within the current billing period.', 'proration_date')
  const changes = applyItemChanges(ctx, sub)
  sub.metadata = applyMetadata(sub.metadata, b.metadata)
  const description = optNullableString(b, 'description')
  if (description !== undefined) sub.description = description
  const pm = optNullableString(b, 'default_payment_method')
  if (pm !== undefined) sub.default_payment_method = pm && attachedPaymentMethod(ctx, sub.customer, pm, 'default_payment_method')
  const cancelAtEnd = optBool(b, 'cancel_at_period_end')
  if (cancelAtEnd !== undefined) {
    Object.assign(sub, cancelAtEnd
      ? { cancel_at_period_end: true, cancel_at: end, canceled_at: ctx.now(), cancellation_details: { ...sub.cancellation_details, reason: 'cancellation_requested' } }
      : { cancel_at_period_end: false, cancel_at: null, canceled_at: null, cancellation_details: { comment: null, feedback: null, reason: null } })
  }
  const prorations = proration === 'none' || sub.status === 'trialing' ? [] : createProrations(ctx, sub, changes, at)
  if (proration === 'always_invoice' && prorations.length) {
    ctx.quiet.add(sub.id)
    const customer = ctx.store.get('customers', sub.customer)!
    const inv = newInvoice(ctx, customer, { subscription: sub, billingReason: 'subscription_update', currency: sub.currency, periodStart: at, periodEnd: at })
    inv.parent.subscription_details.subscription_proration_date = at
    pullPendingItems(ctx, inv, sub.id)
    issueSubscriptionInvoice(ctx, sub, inv, behaviour)
    ctx.quiet.delete(sub.id)
  }
  const prev = previousAttributes(before, sub)
  if (prev) emit(ctx, 'customer.subscription.updated', sub, prev)
  return sub
}

/** `POST /v1/subscription_items/:id` is the same change expressed on one item. */
export function updateSubscriptionItem(ctx: Ctx): Obj {
  allowOnly(ctx.body, ['quantity', 'price', 'metadata', 'proration_behavior', 'proration_date', 'payment_behavior', 'off_session'])
  const sub = ctx.store.all('subscriptions').find((s) => s.items.data.some((i: Obj) => i.id === ctx.params.id))
  if (!sub) throw missing('subscription item', ctx.params.id!)
  const { quantity, price, metadata, ...rest } = ctx.body
  const item = Object.fromEntries(Object.entries({ id: ctx.params.id, quantity, price, metadata }).filter(([, v]) => v !== undefined))
  const updated = updateSubscription({ ...ctx, params: { id: sub.id }, body: { ...rest, items: [item] } })
  return updated.items.data.find((i: Obj) => i.id === ctx.params.id)
}
