import { emit, updateObject, type Ctx } from '../context.ts'
import { invalid } from '../errors.ts'
import { newId } from '../ids.ts'
import { listResponse } from '../list.ts'
import { allowOnly, applyMetadata, listParam, optBool, optEnum, optInt, optNullableString, optObject, optString, reqString } from '../params.ts'
import { resourceRoutes, type Route } from '../route.ts'
import type { Obj } from '../store.ts'
import { newProduct } from './products.ts'

const INTERVALS = ['day', 'week', 'month', 'year'] as const

function recurring(p: Obj | undefined): Obj | null {
  if (!p) return null
  allowOnly(p, ['interval', 'interval_count', 'usage_type'])
  const interval = optEnum(p, 'interval', INTERVALS, 'recurring[interval]')
  if (!interval) throw invalid('Missing required param: recurring[interval].', 'recurring[interval]', 'parameter_missing')
  const count = optInt(p, 'interval_count', 'recurring[interval_count]', 1) ?? 1
  const usage = optEnum(p, 'usage_type', ['licensed'] as const, 'recurring[usage_type]') ?? 'licensed'
  return { interval, interval_count: count, meter: null, usage_type: usage }
}

function takeLookupKey(ctx: Ctx, key: string | null | undefined, transfer: boolean): void {
  if (!key) return
  const holder = ctx.store.all('prices').find((pr) => pr.lookup_key === key)
  if (!holder) return
  if (!transfer) throw invalid(`A price (\`${holder.id}\`) already uses that lookup key.`, 'lookup_key')
  holder.lookup_key = null
}

function create(ctx: Ctx): Obj {
  const b = ctx.body
  allowOnly(b, ['currency', 'unit_amount', 'unit_amount_decimal', 'product', 'product_data', 'recurring', 'nickname', 'lookup_key', 'transfer_lookup_key', 'metadata', 'active', 'billing_scheme', 'tax_behavior'])
  const currency = reqString(b, 'currency').toLowerCase()
  optEnum(b, 'billing_scheme', ['per_unit'] as const)
  let unit = optInt(b, 'unit_amount', 'unit_amount', 0)
  const decimal = optString(b, 'unit_amount_decimal')
  if (unit === undefined && decimal !== undefined) {
    if (!/^\d+$/.test(decimal)) throw invalid('The local Stripe fake supports whole-number unit_amount_decimal only.', 'unit_amount_decimal')
    unit = Number(decimal)
  }
  if (unit === undefined) throw invalid('Missing required param: unit_amount.', 'unit_amount', 'parameter_missing')
  let productId = optString(b, 'product')
  if (productId) ctx.store.require('products', productId, 'product', 'product')
  else {
    const data = optObject(b, 'product_data')
    if (!data) throw invalid('Missing required param: product.', 'product', 'parameter_missing')
    allowOnly(data, ['name', 'metadata', 'unit_label'])
    const prod = newProduct(ctx, reqString(data, 'name', 'product_data[name]'))
    prod.metadata = applyMetadata({}, data.metadata)
    prod.unit_label = optString(data, 'unit_label') ?? null
    emit(ctx, 'product.created', prod)
    productId = prod.id
  }
  const lookupKey = optNullableString(b, 'lookup_key') ?? null
  takeLookupKey(ctx, lookupKey, optBool(b, 'transfer_lookup_key') ?? false)
  const rec = recurring(optObject(b, 'recurring'))
  const price = ctx.store.insert({
    id: newId('price'), object: 'price', active: optBool(b, 'active') ?? true, billing_scheme: 'per_unit',
    created: ctx.now(), currency, custom_unit_amount: null, livemode: false, lookup_key: lookupKey,
    metadata: applyMetadata({}, b.metadata), nickname: optNullableString(b, 'nickname') ?? null, product: productId,
    recurring: rec, tax_behavior: optString(b, 'tax_behavior') ?? 'unspecified', tiers_mode: null,
    transform_quantity: null, type: rec ? 'recurring' : 'one_time', unit_amount: unit, unit_amount_decimal: String(unit),
  })
  emit(ctx, 'price.created', price)
  return price
}

function update(ctx: Ctx): Obj {
  const b = ctx.body
  allowOnly(b, ['active', 'metadata', 'nickname', 'lookup_key', 'transfer_lookup_key'])
  const price = ctx.store.require('prices', ctx.params.id!, 'price')
  return updateObject(ctx, price, 'price.updated', (o) => {
    const active = optBool(b, 'active')
    if (active !== undefined) o.active = active
    const nickname = optNullableString(b, 'nickname')
    if (nickname !== undefined) o.nickname = nickname
    const lookupKey = optNullableString(b, 'lookup_key')
    if (lookupKey !== undefined && lookupKey !== o.lookup_key) {
      takeLookupKey(ctx, lookupKey, optBool(b, 'transfer_lookup_key') ?? false)
      o.lookup_key = lookupKey
    }
    o.metadata = applyMetadata(o.metadata, b.metadata)
  })
}

function list(ctx: Ctx): Obj {
  const b = ctx.body
  allowOnly(b, ['active', 'product', 'type', 'currency', 'lookup_keys', 'limit', 'starting_after', 'ending_before'])
  const active = optBool(b, 'active')
  const product = optString(b, 'product')
  const type = optString(b, 'type')
  const currency = optString(b, 'currency')
  const keys = b.lookup_keys === undefined ? undefined : listParam(b.lookup_keys, 'lookup_keys')
  const items = ctx.store.all('prices').filter((p) => (active === undefined || p.active === active)
    && (!product || p.product === product) && (!type || p.type === type) && (!currency || p.currency === currency)
    && (!keys || keys.includes(p.lookup_key)))
  return listResponse(items, b, '/v1/prices')
}

export const routes: Route[] = [
  ...resourceRoutes('/v1/prices', { create, list, retrieve: (ctx) => ctx.store.require('prices', ctx.params.id!, 'price'), update }),
]
