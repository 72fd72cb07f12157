import { emit, updateObject, type Ctx } from '../context.ts'
import { CARD_TOKENS, PM_TOKENS, cardBehaviour, cardFingerprint, validateCard } from '../cards.ts'
import { invalid, missing } from '../errors.ts'
import { newId } from '../ids.ts'
import { listResponse } from '../list.ts'
import { allowOnly, applyMetadata, optEnum, optInt, optObject, optString, reqString } from '../params.ts'
import { resourceRoutes, type Route } from '../route.ts'
import type { Obj } from '../store.ts'

export function createCardPaymentMethod(ctx: Ctx, number: string, expMonth: number, expYear: number, billing: Obj = {}): Obj {
  validateCard(number, expMonth, expYear, ctx.now())
  const b = cardBehaviour(number)
  const pm = ctx.store.insert({
    id: newId('pm'), object: 'payment_method', allow_redisplay: 'unspecified',
    billing_details: { address: null, email: billing.email ?? null, name: billing.name ?? null, phone: billing.phone ?? null, tax_id: null },
    card: {
      brand: b.brand, checks: { address_line1_check: null, address_postal_code_check: null, cvc_check: 'pass' },
      country: 'US', display_brand: b.brand, exp_month: expMonth, exp_year: expYear,
      fingerprint: cardFingerprint(number), funding: b.funding, generated_from: null, last4: number.slice(-4),
      networks: { available: [b.brand], preferred: null }, regulated_status: 'unregulated',
      three_d_secure_usage: { supported: true }, wallet: null,
    },
    created: ctx.now(), customer: null, customer_account: null, livemode: false, metadata: {}, type: 'card',
  })
  ctx.store.state.cardNumbers[pm.id] = number
  return pm
}

function tokenCard(ctx: Ctx, token: string): Obj {
  const year = new Date(ctx.now() * 1000).getUTCFullYear() + 3
  return createCardPaymentMethod(ctx, PM_TOKENS[token]!, 12, year)
}

/** Attaches a pm (or a test token such as `pm_card_visa`, which yields a fresh pm) to a customer. */
export function attachPaymentMethod(ctx: Ctx, idOrToken: string, customerId: string, param = 'payment_method'): Obj {
  ctx.store.require('customers', customerId, 'customer', 'customer')
  const pm = PM_TOKENS[idOrToken] ? tokenCard(ctx, idOrToken) : ctx.store.require('payment_methods', idOrToken, 'PaymentMethod', param === 'id' ? undefined : param)
  if (pm.customer === customerId) return pm
  if (pm.customer) throw invalid('The payment method you provided has already been attached to a customer.', param)
  pm.customer = customerId
  emit(ctx, 'payment_method.attached', pm, { customer: null })
  return pm
}

function create(ctx: Ctx): Obj {
  const b = ctx.body
  allowOnly(b, ['type', 'card', 'billing_details', 'metadata', 'allow_redisplay'])
  optEnum(b, 'type', ['card'] as const)
  const card = optObject(b, 'card')
  if (!card) throw invalid('Missing required param: card.', 'card', 'parameter_missing')
  allowOnly(card, ['number', 'exp_month', 'exp_year', 'cvc', 'token'])
  const billing = optObject(b, 'billing_details') ?? {}
  let pm: Obj
  const token = optString(card, 'token', 'card[token]')
  if (token) {
    if (!CARD_TOKENS[token]) throw invalid(`No such token: '${token}'`, 'card[token]', 'resource_missing')
    const year = new Date(ctx.now() * 1000).getUTCFullYear() + 3
    pm = createCardPaymentMethod(ctx, CARD_TOKENS[token]!, 12, year, billing)
  } else {
    const number = reqString(card, 'number', 'card[number]').replace(/[\s-]/g, '')
    const month = optInt(card, 'exp_month', 'card[exp_month]') ?? 0
    let year = optInt(card, 'exp_year', 'card[exp_year]') ?? 0
    if (year < 100) year += 2000
    pm = createCardPaymentMethod(ctx, number, month, year, billing)
  }
  pm.metadata = applyMetadata({}, b.metadata)
  return pm
}

function update(ctx: Ctx): Obj {
  allowOnly(ctx.body, ['metadata', 'billing_details', 'card'])
  const pm = ctx.store.require('payment_methods', ctx.params.id!, 'PaymentMethod')
  return updateObject(ctx, pm, 'payment_method.updated', (o) => {
    o.metadata = applyMetadata(o.metadata, ctx.body.metadata)
    const billing = optObject(ctx.body, 'billing_details')
    if (billing) for (const k of ['email', 'name', 'phone']) if (billing[k] !== undefined) o.billing_details[k] = billing[k] || null
    const card = optObject(ctx.body, 'card')
    if (card) {
      allowOnly(card, ['exp_month', 'exp_year'])
      o.card.exp_month = optInt(card, 'exp_month', 'card[exp_month]') ?? o.card.exp_month
      o.card.exp_year = optInt(card, 'exp_year', 'card[exp_year]') ?? o.card.exp_year
    }
  })
}

function attach(ctx: Ctx): Obj {
  allowOnly(ctx.body, ['customer'])
  return attachPaymentMethod(ctx, ctx.params.id!, reqString(ctx.body, 'customer'), 'id')
}

function detach(ctx: Ctx): Obj {
  allowOnly(ctx.body, [])
  const pm = ctx.store.require('payment_methods', ctx.params.id!, 'PaymentMethod')
  if (!pm.customer) throw invalid('The payment method you provided is not attached to a customer so detachment is impossible.')
  const customer = ctx.store.get('customers', pm.customer)
  if (customer && customer.invoice_settings?.default_payment_method === pm.id) {
    customer.invoice_settings.default_payment_method = null
    emit(ctx, 'customer.updated', customer, { invoice_settings: { ...customer.invoice_settings, default_payment_method: pm.id } })
  }
  const previous = pm.customer
  pm.customer = null
  emit(ctx, 'payment_method.detached', pm, { customer: previous })
  return pm
}

function listFor(ctx: Ctx, customer: string, url: string): Obj {
  ctx.store.require('customers', customer, 'customer', ctx.params.id ? undefined : 'customer')
  const type = optString(ctx.body, 'type')
  const items = ctx.store.all('payment_methods').filter((pm) => pm.customer === customer && (!type || pm.type === type))
  return listResponse(items, ctx.body, url)
}

export const routes: Route[] = [
  ...resourceRoutes('/v1/payment_methods', { create, retrieve: (ctx) => ctx.store.require('payment_methods', ctx.params.id!, 'PaymentMethod'), update }),
  { method: 'GET', path: '/v1/payment_methods', handler: (ctx) => {
    allowOnly(ctx.body, ['customer', 'type', 'limit', 'starting_after', 'ending_before'])
    return listFor(ctx, reqString(ctx.body, 'customer'), '/v1/payment_methods')
  } },
  { method: 'POST', path: '/v1/payment_methods/:id/attach', handler: attach },
  { method: 'POST', path: '/v1/payment_methods/:id/detach', handler: detach },
  { method: 'GET', path: '/v1/customers/:id/payment_methods', handler: (ctx) => {
    allowOnly(ctx.body, ['type', 'limit', 'starting_after', 'ending_before', 'allow_redisplay'])
    return listFor(ctx, ctx.params.id!, `/v1/customers/${ctx.params.id}/payment_methods`)
  } },
  { method: 'GET', path: '/v1/customers/:id/payment_methods/:pm', handler: (ctx) => {
    const pm = ctx.store.require('payment_methods', ctx.params.pm!, 'PaymentMethod')
    if (pm.customer !== ctx.params.id) throw missing('PaymentMethod', ctx.params.pm!)
    return pm
  } },
]
