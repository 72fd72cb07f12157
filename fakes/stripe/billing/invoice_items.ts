import type { Ctx } from '../context.ts'
import { newId } from '../ids.ts'
import type { Obj } from '../store.ts'

export interface NewItem {
  customer: string
  currency: string
  amount: number
  description: string | null
  period: { start: number; end: number }
  price?: Obj
  quantity?: number
  subscription?: string
  subscriptionItem?: string
  proration?: boolean
}

/** A pending invoice item (`ii_...`), picked up by the next invoice of its subscription (or customer). */
export function newInvoiceItem(ctx: Ctx, n: NewItem): Obj {
  const quantity = n.quantity ?? 1
  return ctx.store.insert({
    id: newId('ii'), object: 'invoiceitem', amount: n.amount, currency: n.currency, customer: n.customer,
    customer_account: null, date: ctx.now(), description: n.description, discountable: !n.proration, discounts: [],
    invoice: null, livemode: false, metadata: {}, net_amount: n.amount,
    parent: n.subscription
      ? { type: 'subscription_details', subscription_details: { subscription: n.subscription, subscription_item: n.subscriptionItem ?? null } }
      : null,
    period: n.period,
    pricing: n.price
      ? { price_details: { price: n.price.id, product: n.price.product }, type: 'price_details', unit_amount_decimal: String(n.amount / quantity) }
      : null,
    proration: n.proration ?? false, proration_details: { credited_items: null },
    quantity, quantity_decimal: String(quantity), tax_rates: [], test_clock: null,
  })
}

export function itemSubscription(ii: Obj): string | null {
  return ii.parent?.subscription_details?.subscription ?? null
}

/** Line item (`il_...`) for an invoice item. Proration items of a subscription item carry `subscription_item_details`. */
export function lineFromItem(ii: Obj, invoiceId: string): Obj {
  const sub = itemSubscription(ii)
  const si = ii.parent?.subscription_details?.subscription_item ?? null
  const details = { invoice_item: ii.id, proration: ii.proration, proration_details: { credited_items: null }, subscription: sub }
  return {
    id: newId('il'), object: 'line_item', amount: ii.amount, currency: ii.currency, description: ii.description,
    discount_amounts: [], discountable: ii.discountable, discounts: [], invoice: invoiceId, livemode: false,
    metadata: ii.metadata,
    parent: si
      ? { type: 'subscription_item_details', invoice_item_details: null, subscription_item_details: { ...details, subscription_item: si } }
      : { type: 'invoice_item_details', invoice_item_details: details, subscription_item_details: null },
    period: ii.period, pretax_credit_amounts: [], pricing: ii.pricing, quantity: ii.quantity,
    quantity_decimal: ii.quantity_decimal, subscription: sub, subtotal: ii.amount, taxes: [],
  }
}

/** Moves the pending items that belong on this invoice onto it (`subscription` null = items without a subscription). */
export function pullPendingItems(ctx: Ctx, invoice: Obj, subscription: string | null): void {
  const pending = ctx.store.all('invoiceitems').reverse()
    .filter((ii) => !ii.deleted && ii.invoice === null && ii.customer === invoice.customer && itemSubscription(ii) === subscription)
  for (const ii of pending) {
    ii.invoice = invoice.id
    invoice.lines.data.push(lineFromItem(ii, invoice.id))
  }
}
