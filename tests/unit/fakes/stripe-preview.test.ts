import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type Stripe from 'stripe'
import { seatSetup, startFakeStripe } from './helpers.ts'
import type { FakeStripe } from '~~/fakes/stripe/app.ts'

// invoices.createPreview through the real stripe SDK against the fake. Expected amounts follow Stripe's documented
// per-second proration (docs.stripe.com/billing/subscriptions/prorations; formula from memory), and Stripe's own advice
// (docs.stripe.com/api/invoices/create_preview): pass the same proration_date to the update and the charge equals the
// preview. A preview stores nothing: no invoice in the list, no pending items, no event, the quantity unchanged.
let fake: FakeStripe
let stripe: Stripe

beforeAll(async () => ({ fake, stripe } = await startFakeStripe()))
afterAll(async () => fake.close())

describe('previewing a seat change', () => {
  it('always_invoice: the preview is the proration invoice, and the update with the same proration_date charges exactly that', async () => {
    const { price, customer } = await seatSetup(stripe, 1200, 'pm_card_visa')
    const sub = await stripe.subscriptions.create({ customer: customer.id, items: [{ price: price.id, quantity: 5 }] })
    const item = sub.items.data[0]!
    const at = item.current_period_start + Math.round((item.current_period_end - item.current_period_start) / 3)
    const remaining = (item.current_period_end - at) / (item.current_period_end - item.current_period_start)
    const events = (await stripe.events.list({ limit: 100 })).data.length
    const preview = await stripe.invoices.createPreview({ customer: customer.id, subscription: sub.id, subscription_details: { items: [{ id: item.id, quantity: 8 }], proration_behavior: 'always_invoice', proration_date: at } })
    expect(preview.id).toMatch(/^upcoming_in_/)
    expect(preview.amount_due).toBe(Math.round(1200 * 8 * remaining) - Math.round(1200 * 5 * remaining))
    expect(preview.lines.data.every(l => l.parent?.subscription_item_details?.proration === true)).toBe(true)
    expect(preview.parent?.subscription_details?.subscription).toBe(sub.id)

    expect((await stripe.subscriptions.retrieve(sub.id)).items.data[0]!.quantity).toBe(5)
    expect((await stripe.invoices.list({ subscription: sub.id })).data).toHaveLength(1)
    expect((await stripe.invoiceItems.list({ customer: customer.id, pending: true })).data).toHaveLength(0)
    expect((await stripe.events.list({ limit: 100 })).data.length).toBe(events)

    const updated = await stripe.subscriptions.update(sub.id, { items: [{ id: item.id, quantity: 8 }], proration_behavior: 'always_invoice', proration_date: at, expand: ['latest_invoice'] })
    const charged = updated.latest_invoice as Stripe.Invoice
    expect(charged.amount_paid).toBe(preview.amount_due)
  })

  it('create_prorations: the preview is the next renewal, with the new quantity and the pending prorations', async () => {
    const { price, customer } = await seatSetup(stripe, 1000, 'pm_card_mastercard')
    const sub = await stripe.subscriptions.create({ customer: customer.id, items: [{ price: price.id, quantity: 2 }] })
    const item = sub.items.data[0]!
    const at = item.current_period_start + (item.current_period_end - item.current_period_start) / 2
    const preview = await stripe.invoices.createPreview({ subscription: sub.id, subscription_details: { items: [{ id: item.id, quantity: 3 }], proration_date: at } })
    expect(preview.amount_due).toBe(3 * 1000 - 1000 + 1500)
    expect(preview.period_end).toBe(item.current_period_end)
  })

  it('refuses what it does not implement, loudly', async () => {
    const { customer } = await seatSetup(stripe, 1000, 'pm_card_visa')
    await expect(stripe.invoices.createPreview({ customer: customer.id })).rejects.toMatchObject({ statusCode: 400, param: 'subscription' })
    await expect(stripe.invoices.createPreview({ customer: customer.id, subscription: 'sub_missing' })).rejects.toMatchObject({ statusCode: 400, code: 'resource_missing', param: 'subscription' })
  })
})
