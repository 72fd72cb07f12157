import type { FakeStripe } from '../app.ts'
import { cardBehaviour } from '../cards.ts'
import { emit } from '../context.ts'
import { StripeApiError } from '../errors.ts'
import { esc, page } from '../html.ts'
import { attachPaymentMethod, createCardPaymentMethod } from '../resources/payment_methods.ts'

export function safeReturnUrl(v: string | null): string | null {
  if (!v) return null
  try {
    const u = new URL(v)
    return u.protocol === 'http:' || u.protocol === 'https:' ? u.toString() : null
  } catch { return null }
}

export function setupForm(customer: string, returnUrl: string, error?: string, values: Record<string, string> = {}): string {
  return page('Add a card', `<h1>Add a payment card</h1>
${error ? `<p class="err" role="alert">${esc(error)}</p>` : ''}
<form method="post" action="/hosted/setup">
<input type="hidden" name="customer" value="${esc(customer)}"><input type="hidden" name="return_url" value="${esc(returnUrl)}">
<label for="name">Name on card</label><input id="name" name="name" autocomplete="cc-name" value="${esc(values.name)}">
<label for="number">Card number</label><input id="number" name="number" inputmode="numeric" autocomplete="cc-number" required value="${esc(values.number)}" placeholder="4242 4242 4242 4242">
<div class="row"><div><label for="exp">Expiry (MM/YY)</label><input id="exp" name="exp" autocomplete="cc-exp" required value="${esc(values.exp)}" placeholder="12/30"></div>
<div><label for="cvc">CVC</label><input id="cvc" name="cvc" inputmode="numeric" autocomplete="cc-csc" required value="${esc(values.cvc)}"></div></div>
<button type="submit">Save card</button></form>`)
}

/**
 * Posting the form creates a card PaymentMethod, checks it as a SetupIntent would (declining cards fail here, except
 * 4000000000000341 which fails later, on charge), attaches it and makes it the customer's default.
 * Returns the redirect target, or throws a StripeApiError whose message is shown on the form.
 */
export function saveCard(app: FakeStripe, form: URLSearchParams): string {
  const customer = form.get('customer') ?? ''
  const returnUrl = safeReturnUrl(form.get('return_url'))
  if (!returnUrl) throw new StripeApiError(400, { type: 'invalid_request_error', message: 'return_url must be an http(s) URL.' })
  const [mm, yy] = (form.get('exp') ?? '').split('/').map((s) => Number(s.trim()))
  return app.tx((ctx) => {
    const cust = ctx.store.require('customers', customer, 'customer', 'customer')
    const number = (form.get('number') ?? '').replace(/[\s-]/g, '')
    if (!/^\d{3,4}$/.test(form.get('cvc') ?? '')) throw new StripeApiError(402, { type: 'card_error', code: 'incorrect_cvc', message: "Your card's security code is invalid." })
    const pm = createCardPaymentMethod(ctx, number, mm || 0, yy ? (yy < 100 ? 2000 + yy : yy) : 0, { name: form.get('name') || null })
    const decline = cardBehaviour(number)
    if (decline.declinesOnSetup && decline.decline) throw new StripeApiError(402, { type: 'card_error', ...decline.decline })
    attachPaymentMethod(ctx, pm.id, cust.id)
    const before = { ...cust.invoice_settings }
    cust.invoice_settings.default_payment_method = pm.id
    emit(ctx, 'customer.updated', cust, { invoice_settings: before })
    return returnUrl
  })
}
