import { created, emit, updateRoute, type Ctx } from '../context.ts'
import { invalid } from '../errors.ts'
import { newId, randomToken } from '../ids.ts'
import { listResponse } from '../list.ts'
import { allowOnly, applyMetadata, optInt, optNullableString, optObject, optString } from '../params.ts'
import { resourceRoutes, type Route } from '../route.ts'
import type { Obj } from '../store.ts'
import { attachPaymentMethod } from './payment_methods.ts'
import { cancelSubscriptionNow } from '../billing/lifecycle.ts'

const FIELDS = ['email', 'name', 'description', 'phone', 'metadata', 'invoice_settings', 'preferred_locales', 'balance']

function defaultPaymentMethod(ctx: Ctx, customer: Obj, settings: Obj | undefined): string | null | undefined {
  if (!settings) return undefined
  allowOnly(settings, ['default_payment_method'])
  const pm = optNullableString(settings, 'default_payment_method', 'invoice_settings[default_payment_method]')
  if (!pm) return pm
  const found = ctx.store.require('payment_methods', pm, 'PaymentMethod', 'invoice_settings[default_payment_method]')
  if (found.customer !== customer.id) {
    throw invalid(`The customer does not have a payment method with the ID ${pm}. The payment method must be attached to the customer.`, 'invoice_settings[default_payment_method]', 'resource_missing')
  }
  return pm
}

function applyFields(ctx: Ctx, c: Obj): void {
  const p = ctx.body
  for (const key of ['email', 'name', 'description', 'phone'] as const) {
    const v = optNullableString(p, key)
    if (v !== undefined) c[key] = v
  }
  if (p.preferred_locales !== undefined) c.preferred_locales = p.preferred_locales === '' ? [] : Object.values(p.preferred_locales)
  const balance = optInt(p, 'balance')
  if (balance !== undefined) c.balance = balance
  c.metadata = applyMetadata(c.metadata, p.metadata)
  const pm = defaultPaymentMethod(ctx, c, optObject(p, 'invoice_settings'))
  if (pm !== undefined) c.invoice_settings.default_payment_method = pm
}

function create(ctx: Ctx): Obj {
  allowOnly(ctx.body, [...FIELDS, 'payment_method'])
  const c: Obj = {
    id: newId('cus'), object: 'customer', address: null, balance: 0, created: ctx.now(), currency: null,
    default_source: null, delinquent: false, description: null, discount: null, email: null,
    invoice_prefix: randomToken(8).toUpperCase(),
    invoice_settings: { custom_fields: null, default_payment_method: null, footer: null, rendering_options: null },
    livemode: false, metadata: {}, name: null, next_invoice_sequence: 1, phone: null, preferred_locales: [],
    shipping: null, tax_exempt: 'none', test_clock: null,
  }
  ctx.store.insert(c)
  const pmParam = optString(ctx.body, 'payment_method')
  if (pmParam) attachPaymentMethod(ctx, pmParam, c.id, 'payment_method')
  return created(ctx, 'customer', c, applyFields)
}

const update = updateRoute('customers', 'customer', FIELDS, applyFields, true)

function remove(ctx: Ctx): Obj {
  const c = ctx.store.require('customers', ctx.params.id!, 'customer')
  for (const sub of ctx.store.all('subscriptions')) {
    if (sub.customer === c.id && !['canceled', 'incomplete_expired'].includes(sub.status)) cancelSubscriptionNow(ctx, sub)
  }
  const deleted = { id: c.id, object: 'customer', deleted: true }
  ctx.store.state.objects.customers[c.id] = deleted
  emit(ctx, 'customer.deleted', c)
  return deleted
}

function retrieve(ctx: Ctx): Obj {
  const c = ctx.store.get('customers', ctx.params.id!)
  if (!c) return ctx.store.require('customers', ctx.params.id!, 'customer')
  return c
}

function list(ctx: Ctx): Obj {
  allowOnly(ctx.body, ['email', 'limit', 'starting_after', 'ending_before', 'created'])
  const email = optString(ctx.body, 'email')
  const items = ctx.store.all('customers').filter((c) => !c.deleted && (email === undefined || c.email === email))
  return listResponse(items, ctx.body, '/v1/customers')
}

export const routes: Route[] = [
  ...resourceRoutes('/v1/customers', { create, list, retrieve, update, remove }),
]
