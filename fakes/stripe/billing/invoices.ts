import { emit, type Ctx } from '../context.ts'
import { newId } from '../ids.ts'
import type { Obj } from '../store.ts'
import { formatMoney } from './money.ts'

export interface InvoiceOptions {
  subscription?: Obj
  billingReason: string
  currency: string
  periodStart: number
  periodEnd: number
}

export function invoiceSubscription(inv: Obj): string | null {
  return inv.parent?.subscription_details?.subscription ?? null
}

export function newInvoice(ctx: Ctx, customer: Obj, o: InvoiceOptions): Obj {
  const id = newId('in')
  const sub = o.subscription
  return ctx.store.insert({
    id, object: 'invoice', account_country: 'US', account_name: 'Knotwork (local Stripe fake)', account_tax_ids: null,
    amount_due: 0, amount_overpaid: 0, amount_paid: 0, amount_remaining: 0, amount_shipping: 0, application: null,
    attempt_count: 0, attempted: false, auto_advance: true,
    automatic_tax: { disabled_reason: null, enabled: false, liability: null, provider: null, status: null },
    automatically_finalizes_at: null, billing_reason: o.billingReason, collection_method: 'charge_automatically',
    created: ctx.now(), currency: o.currency, custom_fields: null, customer: customer.id, customer_account: null,
    customer_address: null, customer_email: customer.email, customer_name: customer.name, customer_phone: customer.phone,
    customer_shipping: null, customer_tax_exempt: 'none', customer_tax_ids: [], default_payment_method: null,
    default_source: null, default_tax_rates: [], description: null, discounts: [], due_date: null, effective_at: null,
    ending_balance: null, footer: null, from_invoice: null, hosted_invoice_url: null, invoice_pdf: null,
    issuer: { type: 'self' }, last_finalization_error: null, latest_revision: null,
    lines: { object: 'list', data: [], has_more: false, total_count: 0, url: `/v1/invoices/${id}/lines` },
    livemode: false, metadata: {}, next_payment_attempt: null, number: null, on_behalf_of: null,
    parent: sub
      ? { quote_details: null, subscription_details: { metadata: { ...sub.metadata }, subscription: sub.id }, type: 'subscription_details' }
      : null,
    payment_settings: { default_mandate: null, payment_method_options: null, payment_method_types: null },
    period_end: o.periodEnd, period_start: o.periodStart, post_payment_credit_notes_amount: 0,
    pre_payment_credit_notes_amount: 0, receipt_number: null, rendering: null, shipping_cost: null,
    shipping_details: null, starting_balance: 0, statement_descriptor: null, status: 'draft',
    status_transitions: { finalized_at: null, marked_uncollectible_at: null, paid_at: null, voided_at: null },
    subtotal: 0, subtotal_excluding_tax: 0, test_clock: null, total: 0, total_discount_amounts: [],
    total_excluding_tax: 0, total_pretax_credit_amounts: [], total_taxes: [], webhooks_delivered_at: null,
  })
}

/** A subscription item's line for a full period: unit_amount × quantity. */
export function addCycleLine(inv: Obj, sub: Obj, item: Obj, productName: string, start: number, end: number, trial = false): void {
  const price = item.price
  const amount = trial ? 0 : price.unit_amount * item.quantity
  const every = price.recurring.interval_count > 1 ? `every ${price.recurring.interval_count} ${price.recurring.interval}s` : price.recurring.interval
  inv.lines.data.push({
    id: newId('il'), object: 'line_item', amount, currency: price.currency,
    description: trial ? `Trial period for ${productName}` : `${item.quantity} × ${productName} (at ${formatMoney(price.unit_amount, price.currency)} / ${every})`,
    discount_amounts: [], discountable: true, discounts: [], invoice: inv.id, livemode: false, metadata: {},
    parent: {
      type: 'subscription_item_details', invoice_item_details: null,
      subscription_item_details: { invoice_item: null, proration: false, proration_details: { credited_items: null }, subscription: sub.id, subscription_item: item.id },
    },
    period: { start, end }, pretax_credit_amounts: [],
    pricing: { price_details: { price: price.id, product: price.product }, type: 'price_details', unit_amount_decimal: trial ? '0' : String(price.unit_amount) },
    quantity: item.quantity, quantity_decimal: String(item.quantity), subscription: sub.id, subtotal: amount, taxes: [],
  })
}

export function recomputeTotals(inv: Obj): void {
  const total = inv.lines.data.reduce((s: number, l: Obj) => s + l.amount, 0)
  inv.lines.total_count = inv.lines.data.length
  Object.assign(inv, { subtotal: total, subtotal_excluding_tax: total, total, total_excluding_tax: total })
  if (inv.status === 'draft') Object.assign(inv, { amount_due: Math.max(0, total), amount_remaining: Math.max(0, total) })
}

/**
 * Draft → open. The customer balance is applied as Stripe does: x = total + starting_balance;
 * amount_due = max(0, x); ending_balance = min(0, x) (a negative balance is a credit).
 */
export function finalizeInvoice(ctx: Ctx, inv: Obj): void {
  recomputeTotals(inv)
  const customer = ctx.store.get('customers', inv.customer)!
  const x = inv.total + customer.balance
  inv.starting_balance = customer.balance
  inv.ending_balance = Math.min(0, x)
  inv.amount_due = Math.max(0, x)
  inv.amount_remaining = inv.amount_due
  if (customer.balance !== inv.ending_balance) {
    const before = customer.balance
    customer.balance = inv.ending_balance
    emit(ctx, 'customer.updated', customer, { balance: before })
  }
  inv.number = `${customer.invoice_prefix}-${String(customer.next_invoice_sequence).padStart(4, '0')}`
  customer.next_invoice_sequence += 1
  inv.status = 'open'
  inv.status_transitions.finalized_at = ctx.now()
  inv.effective_at = ctx.now()
  inv.hosted_invoice_url = `${ctx.baseUrl}/hosted/invoices/${inv.id}`
  emit(ctx, 'invoice.finalized', inv)
}
