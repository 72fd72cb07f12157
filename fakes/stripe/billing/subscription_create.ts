import { emit, type Ctx } from '../context.ts'
import { invalid } from '../errors.ts'
import { newId } from '../ids.ts'
import { allowOnly, applyMetadata, listParam, optBool, optEnum, optInt, optNullableString, optString, reqString } from '../params.ts'
import type { Obj } from '../store.ts'
import { addCycleLine, newInvoice } from './invoices.ts'
import { addIntervals } from './periods.ts'
import { attachedPaymentMethod, issueSubscriptionInvoice, newSubscriptionItem, productName, recurringPrice, sameBillingTerms } from './subscription_parts.ts'

export const PAYMENT_BEHAVIOURS = ['allow_incomplete', 'default_incomplete', 'error_if_incomplete'] as const

/**
 * Creates a subscription and its first invoice (billed in advance), then charges the default payment method.
 * allow_incomplete (default): a decline leaves status `incomplete` and the invoice open; error_if_incomplete: 402 and
 * nothing is created; default_incomplete: no charge attempt.
 */
export function createSubscription(ctx: Ctx): Obj {
  const b = ctx.body
  allowOnly(b, ['customer', 'items', 'default_payment_method', 'metadata', 'payment_behavior', 'proration_behavior',
    'trial_period_days', 'trial_end', 'cancel_at_period_end', 'description', 'off_session', 'collection_method'])
  const customer = ctx.store.require('customers', reqString(b, 'customer'), 'customer', 'customer')
  optEnum(b, 'collection_method', ['charge_automatically'] as const)
  const behaviour = optEnum(b, 'payment_behavior', PAYMENT_BEHAVIOURS) ?? 'allow_incomplete'
  const rawItems = listParam(b.items, 'items')
  if (!rawItems.length) throw invalid('Missing required param: items.', 'items', 'parameter_missing')
  const wanted = rawItems.map((it, i) => {
    allowOnly(it, ['price', 'quantity', 'metadata'])
    const price = recurringPrice(ctx, reqString(it, 'price', `items[${i}][price]`), `items[${i}][price]`)
    return { price, quantity: optInt(it, 'quantity', `items[${i}][quantity]`, 0) ?? 1, metadata: it.metadata }
  })
  wanted.forEach((w, i) => sameBillingTerms(wanted[0]!.price, w.price, `items[${i}][price]`))
  const { interval, interval_count: count } = wanted[0]!.price.recurring
  const now = ctx.now()
  const days = optInt(b, 'trial_period_days', 'trial_period_days', 0)
  const trialEndParam = b.trial_end === 'now' ? now : optInt(b, 'trial_end', 'trial_end', now)
  const trialEnd = trialEndParam ?? (days ? now + days * 86400 : null)
  const trialing = trialEnd !== null && trialEnd > now
  const anchor = trialing ? trialEnd! : now
  const end = trialing ? trialEnd! : addIntervals(anchor, interval, count, 1)
  const id = newId('sub')
  const pmParam = optString(b, 'default_payment_method')
  const sub: Obj = ctx.store.insert({
    id, object: 'subscription', application: null, application_fee_percent: null,
    automatic_tax: { disabled_reason: null, enabled: false, liability: null }, billing_cycle_anchor: anchor,
    billing_cycle_anchor_config: null, billing_mode: { flexible: null, type: 'classic' }, billing_thresholds: null,
    cancel_at: null, cancel_at_period_end: false, canceled_at: null,
    cancellation_details: { comment: null, feedback: null, reason: null }, collection_method: 'charge_automatically',
    created: now, currency: wanted[0]!.price.currency, customer: customer.id, customer_account: null,
    days_until_due: null, default_payment_method: pmParam ? attachedPaymentMethod(ctx, customer.id, pmParam, 'default_payment_method') : null,
    default_source: null, default_tax_rates: [], description: optNullableString(b, 'description') ?? null, discounts: [],
    ended_at: null, invoice_settings: { account_tax_ids: null, issuer: { type: 'self' } },
    items: { object: 'list', data: [], has_more: false, total_count: 0, url: `/v1/subscription_items?subscription=${id}` },
    latest_invoice: null, livemode: false, metadata: applyMetadata({}, b.metadata), next_pending_invoice_item_invoice: null,
    on_behalf_of: null, pause_collection: null,
    payment_settings: { payment_method_options: null, payment_method_types: null, save_default_payment_method: 'off' },
    pending_invoice_item_interval: null, pending_setup_intent: null, pending_update: null, schedule: null,
    start_date: now, status: 'incomplete', test_clock: null, transfer_data: null,
    trial_end: trialing ? trialEnd : null, trial_settings: { end_behavior: { missing_payment_method: 'create_invoice' } },
    trial_start: trialing ? now : null,
  })
  for (const w of wanted) {
    const item = newSubscriptionItem(ctx, id, w.price, w.quantity, now, end)
    item.metadata = applyMetadata({}, w.metadata)
    sub.items.data.push(item)
  }
  sub.items.total_count = sub.items.data.length
  if (optBool(b, 'cancel_at_period_end')) Object.assign(sub, { cancel_at_period_end: true, cancel_at: end, canceled_at: now })
  const mark = ctx.events.length
  ctx.quiet.add(id)
  const inv = newInvoice(ctx, customer, { subscription: sub, billingReason: 'subscription_create', currency: sub.currency, periodStart: now, periodEnd: now })
  for (const item of sub.items.data) addCycleLine(inv, sub, item, productName(ctx, item.price), now, end, trialing)
  issueSubscriptionInvoice(ctx, sub, inv, behaviour)
  ctx.quiet.delete(id)
  emit(ctx, 'customer.subscription.created', sub, undefined, mark)
  return sub
}
