import { emit, type Ctx } from '../context.ts'
import { invalid } from '../errors.ts'
import { newId } from '../ids.ts'
import { clone, type Obj } from '../store.ts'
import { finalizeInvoice } from './invoices.ts'
import { attemptPayment } from './payment.ts'

/** A recurring, active price named in a parameter. */
export function recurringPrice(ctx: Ctx, id: string, param: string): Obj {
  const price = ctx.store.require('prices', id, 'price', param)
  if (!price.recurring) throw invalid('The price specified is set to `type=one_time` but this field only accepts prices with `type=recurring`.', param)
  if (!price.active) throw invalid('The price specified is inactive. This field only accepts active prices.', param)
  return price
}

export function planOf(price: Obj): Obj {
  return {
    id: price.id, object: 'plan', active: price.active, amount: price.unit_amount, amount_decimal: price.unit_amount_decimal,
    billing_scheme: price.billing_scheme, created: price.created, currency: price.currency,
    interval: price.recurring.interval, interval_count: price.recurring.interval_count, livemode: false,
    metadata: price.metadata, meter: null, nickname: price.nickname, product: price.product, tiers_mode: null,
    transform_usage: null, trial_period_days: null, usage_type: price.recurring.usage_type,
  }
}

export function newSubscriptionItem(ctx: Ctx, subId: string, price: Obj, quantity: number, start: number, end: number): Obj {
  return {
    id: newId('si'), object: 'subscription_item', billing_thresholds: null, created: ctx.now(),
    current_period_end: end, current_period_start: start, discounts: [], metadata: {}, plan: planOf(price),
    price: clone(price), quantity, subscription: subId, tax_rates: [],
  }
}

export function productName(ctx: Ctx, price: Obj): string {
  return ctx.store.get('products', price.product)?.name ?? price.product
}

/** The payment method must already be attached to the subscription's customer. */
export function attachedPaymentMethod(ctx: Ctx, customer: string, id: string, param: string): string {
  const pm = ctx.store.require('payment_methods', id, 'PaymentMethod', param)
  if (pm.customer !== customer) {
    throw invalid(`The customer does not have a payment method with the ID ${id}. The payment method must be attached to the customer.`, param, 'resource_missing')
  }
  return id
}

export function sameBillingTerms(a: Obj, b: Obj, param: string): void {
  if (a.currency !== b.currency) throw invalid('All prices on a subscription must have the same currency.', param)
  if (a.recurring.interval !== b.recurring.interval || a.recurring.interval_count !== b.recurring.interval_count) {
    throw invalid('The local Stripe fake requires all prices on a subscription to share one billing interval (no interval changes).', param)
  }
}

/** Announces, finalises and (unless payment_behavior defers it) charges a subscription's new invoice. */
export function issueSubscriptionInvoice(ctx: Ctx, sub: Obj, inv: Obj, behaviour: string): void {
  sub.latest_invoice = inv.id
  emit(ctx, 'invoice.created', inv)
  finalizeInvoice(ctx, inv)
  if (inv.status === 'open' && (inv.amount_due === 0 || behaviour !== 'default_incomplete')) {
    const err = attemptPayment(ctx, inv)
    if (err && behaviour === 'error_if_incomplete') throw err
  }
}
