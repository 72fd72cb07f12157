import { emit, updateObject, type Ctx } from '../context.ts'
import { invalid } from '../errors.ts'
import { createdFilter, listResponse } from '../list.ts'
import { allowOnly, applyMetadata, optBool, optEnum, optNullableString, optString, reqString } from '../params.ts'
import { resourceRoutes, type Route } from '../route.ts'
import type { Obj } from '../store.ts'
import { pullPendingItems } from '../billing/invoice_items.ts'
import { finalizeInvoice, invoiceSubscription, newInvoice, recomputeTotals } from '../billing/invoices.ts'
import { markPaid, attemptPayment } from '../billing/payment.ts'
import { attachedPaymentMethod } from '../billing/subscription_parts.ts'
import { previewInvoice } from '../billing/preview.ts'

const get = (ctx: Ctx) => ctx.store.require('invoices', ctx.params.id!, 'invoice')

function create(ctx: Ctx): Obj {
  const b = ctx.body
  allowOnly(b, ['customer', 'subscription', 'auto_advance', 'collection_method', 'description', 'metadata', 'pending_invoice_items_behavior', 'currency', 'default_payment_method'])
  const customer = ctx.store.require('customers', reqString(b, 'customer'), 'customer', 'customer')
  optEnum(b, 'collection_method', ['charge_automatically'] as const)
  const subId = optString(b, 'subscription')
  const sub = subId ? ctx.store.require('subscriptions', subId, 'subscription', 'subscription') : undefined
  const now = ctx.now()
  const inv = newInvoice(ctx, customer, { subscription: sub, billingReason: 'manual', currency: (optString(b, 'currency') ?? sub?.currency ?? 'usd').toLowerCase(), periodStart: now, periodEnd: now })
  inv.auto_advance = optBool(b, 'auto_advance') ?? false
  inv.description = optNullableString(b, 'description') ?? null
  inv.metadata = applyMetadata({}, b.metadata)
  const pm = optString(b, 'default_payment_method')
  if (pm) inv.default_payment_method = attachedPaymentMethod(ctx, customer.id, pm, 'default_payment_method')
  if ((optEnum(b, 'pending_invoice_items_behavior', ['include', 'exclude'] as const) ?? 'exclude') === 'include' || sub) pullPendingItems(ctx, inv, sub?.id ?? null)
  recomputeTotals(inv)
  emit(ctx, 'invoice.created', inv)
  return inv
}

function update(ctx: Ctx): Obj {
  allowOnly(ctx.body, ['description', 'metadata', 'auto_advance', 'default_payment_method'])
  const inv = get(ctx)
  if (inv.status !== 'draft' && Object.keys(ctx.body).some((k) => k !== 'metadata' && k !== 'expand')) throw invalid('Finalized invoices can only update metadata (in this fake).')
  return updateObject(ctx, inv, 'invoice.updated', (o) => {
    const d = optNullableString(ctx.body, 'description')
    if (d !== undefined) o.description = d
    o.auto_advance = optBool(ctx.body, 'auto_advance') ?? o.auto_advance
    o.metadata = applyMetadata(o.metadata, ctx.body.metadata)
    const pm = optNullableString(ctx.body, 'default_payment_method')
    if (pm !== undefined) o.default_payment_method = pm && attachedPaymentMethod(ctx, o.customer, pm, 'default_payment_method')
  })
}

function finalize(ctx: Ctx): Obj {
  allowOnly(ctx.body, ['auto_advance'])
  const inv = get(ctx)
  if (inv.status !== 'draft') throw invalid("This invoice is already finalized, you can't re-finalize a non-draft invoice.", undefined, 'invoice_not_editable')
  inv.auto_advance = optBool(ctx.body, 'auto_advance') ?? inv.auto_advance
  finalizeInvoice(ctx, inv)
  if (inv.amount_due === 0) markPaid(ctx, inv)
  return inv
}

/** Pays an open (or draft: finalized first) invoice; a decline answers 402 but keeps the recorded attempt. */
function pay(ctx: Ctx): Obj {
  allowOnly(ctx.body, ['payment_method', 'paid_out_of_band', 'off_session', 'forgive'])
  const inv = get(ctx)
  if (inv.status === 'draft') finalizeInvoice(ctx, inv)
  if (inv.status === 'paid') throw invalid('Invoice is already paid', undefined, 'invoice_already_paid')
  if (inv.status === 'void') throw invalid('You cannot pay a void invoice.', undefined, 'invoice_not_open')
  if (optBool(ctx.body, 'paid_out_of_band')) { markPaid(ctx, inv, true); return inv }
  const pm = optString(ctx.body, 'payment_method')
  const err = attemptPayment(ctx, inv, pm ? attachedPaymentMethod(ctx, inv.customer, pm, 'payment_method') : undefined)
  if (err) { err.keepState = true; throw err }
  return inv
}

function setStatus(ctx: Ctx, status: 'void' | 'uncollectible'): Obj {
  allowOnly(ctx.body, [])
  const inv = get(ctx)
  if (inv.status !== 'open' && !(status === 'void' && inv.status === 'uncollectible')) throw invalid(`You can only ${status === 'void' ? 'void' : 'mark uncollectible'} an open invoice (this one is ${inv.status}).`, undefined, 'invoice_not_open')
  inv.status = status
  inv.next_payment_attempt = null
  if (status === 'void') { inv.amount_remaining = 0; inv.status_transitions.voided_at = ctx.now() }
  else inv.status_transitions.marked_uncollectible_at = ctx.now()
  emit(ctx, status === 'void' ? 'invoice.voided' : 'invoice.marked_uncollectible', inv)
  return inv
}

function remove(ctx: Ctx): Obj {
  const inv = get(ctx)
  if (inv.status !== 'draft') throw invalid('You can only delete draft invoices.', undefined, 'invoice_not_editable')
  for (const ii of ctx.store.all('invoiceitems')) if (ii.invoice === inv.id) ii.invoice = null
  delete ctx.store.state.objects.invoices[inv.id]
  emit(ctx, 'invoice.deleted', inv)
  return { id: inv.id, object: 'invoice', deleted: true }
}

function list(ctx: Ctx): Obj {
  allowOnly(ctx.body, ['customer', 'subscription', 'status', 'collection_method', 'created', 'limit', 'starting_after', 'ending_before'])
  const customer = optString(ctx.body, 'customer')
  const sub = optString(ctx.body, 'subscription')
  const status = optString(ctx.body, 'status')
  const created = createdFilter(ctx.body)
  const items = ctx.store.all('invoices').filter((i) => (!customer || i.customer === customer)
    && (!sub || invoiceSubscription(i) === sub) && (!status || i.status === status) && created(i))
  return listResponse(items, ctx.body, '/v1/invoices')
}

export const routes: Route[] = [
  ...resourceRoutes('/v1/invoices', { create, list, retrieve: get, update, remove }),
  { method: 'POST', path: '/v1/invoices/create_preview', handler: previewInvoice },
  { method: 'GET', path: '/v1/invoices/:id/lines', handler: (ctx) => listResponse([...get(ctx).lines.data], ctx.body, `/v1/invoices/${ctx.params.id}/lines`) },
  { method: 'POST', path: '/v1/invoices/:id/finalize', handler: finalize },
  { method: 'POST', path: '/v1/invoices/:id/pay', handler: pay },
  { method: 'POST', path: '/v1/invoices/:id/void', handler: (ctx) => setStatus(ctx, 'void') },
  { method: 'POST', path: '/v1/invoices/:id/mark_uncollectible', handler: (ctx) => setStatus(ctx, 'uncollectible') },
]
