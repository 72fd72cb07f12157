import { emit, type Ctx } from '../context.ts'
import { invalid } from '../errors.ts'
import { listResponse } from '../list.ts'
import { allowOnly, applyMetadata, optBool, optInt, optNullableString, optObject, optString, reqString } from '../params.ts'
import { resourceRoutes, type Route } from '../route.ts'
import type { Obj } from '../store.ts'
import { lineFromItem, newInvoiceItem } from '../billing/invoice_items.ts'
import { recomputeTotals } from '../billing/invoices.ts'

function create(ctx: Ctx): Obj {
  const b = ctx.body
  allowOnly(b, ['customer', 'amount', 'currency', 'description', 'pricing', 'quantity', 'subscription', 'invoice', 'metadata', 'period'])
  const customer = ctx.store.require('customers', reqString(b, 'customer'), 'customer', 'customer')
  const pricing = optObject(b, 'pricing')
  const price = pricing ? ctx.store.require('prices', reqString(pricing, 'price', 'pricing[price]'), 'price', 'pricing[price]') : undefined
  const quantity = optInt(b, 'quantity', 'quantity', 1) ?? 1
  const amount = price ? price.unit_amount * quantity : optInt(b, 'amount')
  if (amount === undefined) throw invalid('Missing required param: amount.', 'amount', 'parameter_missing')
  const currency = (price?.currency ?? reqString(b, 'currency')).toLowerCase()
  const sub = optString(b, 'subscription')
  if (sub) ctx.store.require('subscriptions', sub, 'subscription', 'subscription')
  const period = optObject(b, 'period')
  const now = ctx.now()
  const ii = newInvoiceItem(ctx, {
    customer: customer.id, currency, amount, description: optNullableString(b, 'description') ?? null, price, quantity, subscription: sub,
    period: { start: Number(period?.start ?? now), end: Number(period?.end ?? now) },
  })
  ii.metadata = applyMetadata({}, b.metadata)
  const invId = optString(b, 'invoice')
  if (invId) {
    const inv = ctx.store.require('invoices', invId, 'invoice', 'invoice')
    if (inv.status !== 'draft') throw invalid('You can only add invoice items to draft invoices.', 'invoice')
    ii.invoice = inv.id
    inv.lines.data.push(lineFromItem(ii, inv.id))
    recomputeTotals(inv)
  }
  emit(ctx, 'invoiceitem.created', ii)
  return ii
}

function list(ctx: Ctx): Obj {
  allowOnly(ctx.body, ['customer', 'invoice', 'pending', 'limit', 'starting_after', 'ending_before'])
  const customer = optString(ctx.body, 'customer')
  const invoice = optString(ctx.body, 'invoice')
  const pending = optBool(ctx.body, 'pending')
  const items = ctx.store.all('invoiceitems').filter((i) => !i.deleted && (!customer || i.customer === customer)
    && (!invoice || i.invoice === invoice) && (pending === undefined || (i.invoice === null) === pending))
  return listResponse(items, ctx.body, '/v1/invoiceitems')
}

function remove(ctx: Ctx): Obj {
  const ii = ctx.store.require('invoiceitems', ctx.params.id!, 'invoiceitem')
  if (ii.invoice) throw invalid('This invoice item is already on an invoice and cannot be deleted.')
  delete ctx.store.state.objects.invoiceitems[ii.id]
  emit(ctx, 'invoiceitem.deleted', ii)
  return { id: ii.id, object: 'invoiceitem', deleted: true }
}

export const routes: Route[] = [
  ...resourceRoutes('/v1/invoiceitems', { create, list, retrieve: (ctx) => ctx.store.require('invoiceitems', ctx.params.id!, 'invoiceitem'), remove }),
]
