import { emit, type Ctx } from '../context.ts'
import { cardBehaviour } from '../cards.ts'
import { StripeApiError, cardError, invalid } from '../errors.ts'
import type { Obj } from '../store.ts'
import { invoiceSubscription } from './invoices.ts'
import { afterInvoicePayment } from './lifecycle.ts'

/** Dunning: retries 3, 5 and 7 days after each failure (a fixed schedule standing in for Stripe's Smart Retries). */
export const RETRY_DAYS = [3, 5, 7]

export function markPaid(ctx: Ctx, inv: Obj, outOfBand = false): void {
  inv.status = 'paid'
  inv.amount_paid = inv.amount_due
  inv.amount_remaining = 0
  if (outOfBand) inv.amount_paid_off_stripe = inv.amount_due
  inv.next_payment_attempt = null
  inv.status_transitions.paid_at = ctx.now()
  emit(ctx, 'invoice.paid', inv)
  emit(ctx, 'invoice.payment_succeeded', inv)
  afterInvoicePayment(ctx, inv, true)
}

function paymentMethodFor(ctx: Ctx, inv: Obj): string | null {
  if (inv.default_payment_method) return inv.default_payment_method
  const subId = invoiceSubscription(inv)
  const sub = subId ? ctx.store.get('subscriptions', subId) : undefined
  if (sub?.default_payment_method) return sub.default_payment_method
  return ctx.store.get('customers', inv.customer)?.invoice_settings?.default_payment_method ?? null
}

/**
 * Charges an open invoice with the given or default payment method. Returns null when paid, or the error
 * (402 card_error, or 400 when there is no payment method). A failure records the attempt, schedules a retry
 * (not for a subscription's first invoice) and emits `invoice.payment_failed`.
 */
export function attemptPayment(ctx: Ctx, inv: Obj, paymentMethod?: string): StripeApiError | null {
  if (inv.status !== 'open' && inv.status !== 'uncollectible') throw invalid(`Invoice is already ${inv.status}.`, undefined, 'invoice_not_open')
  if (inv.amount_due === 0) { markPaid(ctx, inv); return null }
  inv.attempted = true
  inv.attempt_count += 1
  const pm = paymentMethod ?? paymentMethodFor(ctx, inv)
  const number = pm ? ctx.store.state.cardNumbers[pm] : undefined
  const decline = number ? cardBehaviour(number).decline : undefined
  if (pm && number && !decline) { markPaid(ctx, inv); return null }
  const retryIn = RETRY_DAYS[inv.attempt_count - 1]
  inv.next_payment_attempt = inv.billing_reason === 'subscription_create' || retryIn === undefined ? null : ctx.now() + retryIn * 86400
  inv.last_finalization_error = null
  emit(ctx, 'invoice.payment_failed', inv)
  afterInvoicePayment(ctx, inv, false)
  if (!pm || !number) {
    return invalid('This customer has no attached payment source or default payment method. Please consider adding a default payment method.', undefined, 'invoice_no_payment_method_types')
  }
  const err = cardError(decline!.code, decline!.message, decline!.decline_code)
  err.body.payment_method = ctx.store.get('payment_methods', pm)
  return err
}
