import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type Stripe from 'stripe'
import { advance, seatSetup, startFakeStripe } from './helpers.ts'
import type { FakeStripe } from '~~/fakes/stripe/app.ts'

// Expected proration amounts follow Stripe's documented per-second proration
// (docs.stripe.com/billing/subscriptions/prorations; formula from memory):
// credit = unit × old_qty × remaining/period, charge = unit × new_qty × remaining/period.
let fake: FakeStripe
let stripe: Stripe
let base: string

beforeAll(async () => ({ fake, stripe, base } = await startFakeStripe()))
afterAll(async () => fake.close())

describe('per-seat subscription through the real stripe SDK', () => {
  it('subscribes, prorates a seat increase with always_invoice, and replays an idempotent update', async () => {
    const { price, customer, pm } = await seatSetup(stripe, 1200, 'pm_card_visa')
    expect(pm.id).toMatch(/^pm_/)
    expect(pm.id).not.toBe('pm_card_visa')
    const twice = [0, 1].map(() => stripe.customers.create({ email: 'twice@larkspur.example' }, { idempotencyKey: 'create-twice' }))
    const [a, b] = await Promise.all(twice)
    expect(b!.id).toBe(a!.id)
    expect((await stripe.customers.list({ email: 'twice@larkspur.example' })).data).toHaveLength(1)
    const found = await stripe.customers.list({ email: 'billing@larkspur.example' })
    expect(found.data.map((c) => c.id)).toContain(customer.id)

    const sub = await stripe.subscriptions.create({ customer: customer.id, items: [{ price: price.id, quantity: 5 }], expand: ['latest_invoice'] })
    expect(sub.status).toBe('active')
    const first = sub.latest_invoice as Stripe.Invoice
    expect(first.status).toBe('paid')
    expect(first.amount_paid).toBe(6000)
    expect(first.hosted_invoice_url).toBe(`${base}/hosted/invoices/${first.id}`)

    const item = sub.items.data[0]!
    const { current_period_start: start, current_period_end: end } = item
    expect(new Date(end * 1000).getUTCMonth()).toBe((new Date(start * 1000).getUTCMonth() + 1) % 12)
    const at = start + Math.round((end - start) / 3)
    const remaining = (end - at) / (end - start)
    const credit = -Math.round(1200 * 5 * remaining)
    const charge = Math.round(1200 * 8 * remaining)
    const change = { items: [{ id: item.id, quantity: 8 }], proration_behavior: 'always_invoice' as const, proration_date: at, expand: ['latest_invoice'] }

    const updated = await stripe.subscriptions.update(sub.id, change, { idempotencyKey: 'seats-5-to-8' })
    const inv = updated.latest_invoice as Stripe.Invoice
    expect(updated.items.data[0]!.quantity).toBe(8)
    expect(inv.billing_reason).toBe('subscription_update')
    expect(inv.lines.data.map((l) => l.amount).sort((a, b) => a - b)).toEqual([credit, charge])
    expect(inv.amount_due).toBe(credit + charge)
    expect(Math.abs(inv.amount_due - 1200 * 3 * remaining)).toBeLessThanOrEqual(1)
    expect(inv.status).toBe('paid')
    expect(inv.lines.data.every((l) => l.parent?.subscription_item_details?.proration === true)).toBe(true)

    const again = await stripe.subscriptions.update(sub.id, change, { idempotencyKey: 'seats-5-to-8' })
    expect((again.latest_invoice as Stripe.Invoice).id).toBe(inv.id)
    expect(again.lastResponse.headers['idempotent-replayed']).toBe('true')
    const { lastResponse: _a, ...replayed } = again
    const { lastResponse: _b, ...original } = updated
    expect(replayed).toEqual(original)
    const invoices = await stripe.invoices.list({ subscription: sub.id })
    expect(invoices.data).toHaveLength(2)

    await expect(stripe.subscriptions.update(sub.id, { ...change, items: [{ id: item.id, quantity: 9 }] }, { idempotencyKey: 'seats-5-to-8' }))
      .rejects.toMatchObject({ type: 'StripeIdempotencyError', statusCode: 400 })
  })

  it('keeps create_prorations pending until the renewal invoice, which bills the new quantity', async () => {
    const { price, customer } = await seatSetup(stripe, 1000, 'pm_card_mastercard')
    const sub = await stripe.subscriptions.create({ customer: customer.id, items: [{ price: price.id, quantity: 2 }] })
    const item = sub.items.data[0]!
    const at = item.current_period_start + (item.current_period_end - item.current_period_start) / 2
    await stripe.subscriptions.update(sub.id, { items: [{ id: item.id, quantity: 3 }], proration_date: at })
    const pending = await stripe.invoiceItems.list({ customer: customer.id, pending: true })
    expect(pending.data.map((i) => i.amount).sort((a, b) => a - b)).toEqual([-1000, 1500])

    await advance(base, item.current_period_end - Math.floor(Date.now() / 1000) + 60)
    const renewed = await stripe.subscriptions.retrieve(sub.id, { expand: ['latest_invoice'] })
    const inv = renewed.latest_invoice as Stripe.Invoice
    expect(inv.billing_reason).toBe('subscription_cycle')
    expect(inv.amount_due).toBe(3 * 1000 - 1000 + 1500)
    expect(inv.status).toBe('paid')
    expect(renewed.items.data[0]!.current_period_start).toBe(item.current_period_end)
    expect((await stripe.invoiceItems.list({ customer: customer.id, pending: true })).data).toHaveLength(0)
  })

  it('answers Stripe-shaped errors: 401 without a test key, 404 resource_missing, 400 unknown parameter', async () => {
    const { client } = await import('./helpers.ts')
    await expect(client(Number(new URL(base).port), 'sk_live_nope').customers.list()).rejects.toMatchObject({ statusCode: 401, type: 'StripeAuthenticationError' })
    await expect(stripe.customers.retrieve('cus_missing')).rejects.toMatchObject({ statusCode: 404, code: 'resource_missing', type: 'StripeInvalidRequestError' })
    await expect(stripe.customers.create({ colour: 'red' } as never)).rejects.toMatchObject({ statusCode: 400, param: 'colour' })
  })
})
