import { created, updateRoute, type Ctx } from '../context.ts'
import { newId } from '../ids.ts'
import { listResponse } from '../list.ts'
import { allowOnly, applyMetadata, optBool, optNullableString, reqString } from '../params.ts'
import { resourceRoutes, type Route } from '../route.ts'
import type { Obj } from '../store.ts'

export function newProduct(ctx: Ctx, name: string): Obj {
  const now = ctx.now()
  return ctx.store.insert({
    id: newId('prod'), object: 'product', active: true, created: now, default_price: null, description: null,
    images: [], livemode: false, marketing_features: [], metadata: {}, name, package_dimensions: null,
    shippable: null, statement_descriptor: null, tax_code: null, type: 'service', unit_label: null, updated: now, url: null,
  })
}

function applyFields(ctx: Ctx, p: Obj): void {
  const active = optBool(ctx.body, 'active')
  if (active !== undefined) p.active = active
  for (const key of ['description', 'unit_label', 'statement_descriptor', 'url'] as const) {
    const v = optNullableString(ctx.body, key)
    if (v !== undefined) p[key] = v
  }
  p.metadata = applyMetadata(p.metadata, ctx.body.metadata)
}

const FIELDS = ['name', 'active', 'description', 'unit_label', 'statement_descriptor', 'url', 'metadata']

function create(ctx: Ctx): Obj {
  allowOnly(ctx.body, [...FIELDS, 'id'])
  const p = newProduct(ctx, reqString(ctx.body, 'name'))
  const id = optNullableString(ctx.body, 'id')
  if (id) {
    delete ctx.store.state.objects.products[p.id]
    p.id = id
    ctx.store.insert(p)
  }
  return created(ctx, 'product', p, applyFields)
}

const update = updateRoute('products', 'product', FIELDS, (ctx, p) => {
  if (ctx.body.name !== undefined) p.name = reqString(ctx.body, 'name')
  applyFields(ctx, p)
  p.updated = ctx.now()
})

function list(ctx: Ctx): Obj {
  allowOnly(ctx.body, ['active', 'limit', 'starting_after', 'ending_before', 'ids'])
  const active = optBool(ctx.body, 'active')
  const ids = ctx.body.ids ? Object.values(ctx.body.ids) : undefined
  const items = ctx.store.all('products').filter((p) => (active === undefined || p.active === active) && (!ids || ids.includes(p.id)))
  return listResponse(items, ctx.body, '/v1/products')
}

export const routes: Route[] = [
  ...resourceRoutes('/v1/products', { create, list, retrieve: (ctx) => ctx.store.require('products', ctx.params.id!, 'product'), update }),
]
