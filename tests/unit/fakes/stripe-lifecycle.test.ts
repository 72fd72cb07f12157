import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type Stripe from 'stripe'
import { advance, seatSetup, startFakeStripe } from './helpers.ts'
import type { FakeStripe } from '~~/fakes/stripe/app.ts'

// Behaviour checked against Stripe's subscription docs (docs.stripe.com/billing/subscriptions/overview, from memory):
// an unpaid first invoice expires the subscription after 23 hours; cancel_at_period_end ends it at the period end;
// a trial bills nothing until it ends.
let fake: FakeStripe
let stripe: Stripe
let base: string

beforeAll(async () => ({ fake, stripe, base } = await startFakeStripe()))
afterAll(async () => fake.close())

describe('subscription lifecycle on the fake clock', () => {
  it('expires an incomplete subscription, ends one at period end, and bills a trial only when it ends', async () => {
    const declined = await seatSetup(stripe, 700, 'pm_card_chargeDeclined')
    const incomplete = await stripe.subscriptions.create({ customer: declined.customer.id, items: [{ price: declined.price.id }] })
    const ok = await seatSetup(stripe, 700, 'pm_card_visa')
    const ending = await stripe.subscriptions.create({ customer: ok.customer.id, items: [{ price: ok.price.id, quantity: 2 }] })
    await stripe.subscriptions.update(ending.id, { cancel_at_period_end: true })
    const trial = await stripe.subscriptions.create({ customer: ok.customer.id, items: [{ price: ok.price.id, quantity: 3 }], trial_period_days: 14, expand: ['latest_invoice'] })
    expect(trial.status).toBe('trialing')
    expect((trial.latest_invoice as Stripe.Invoice).amount_due).toBe(0)

    await advance(base, 24 * 3600)
    expect((await stripe.subscriptions.retrieve(incomplete.id)).status).toBe('incomplete_expired')
    expect((await stripe.invoices.retrieve(incomplete.latest_invoice as string)).status).toBe('void')

    await advance(base, 14 * 86400)
    const afterTrial = await stripe.subscriptions.retrieve(trial.id, { expand: ['latest_invoice'] })
    expect(afterTrial.status).toBe('active')
    expect((afterTrial.latest_invoice as Stripe.Invoice).amount_paid).toBe(2100)

    await advance(base, 20 * 86400)
    const ended = await stripe.subscriptions.retrieve(ending.id)
    expect(ended.status).toBe('canceled')
    expect(ended.ended_at).toBe(ending.items.data[0]!.current_period_end)
    const deleted = await stripe.events.list({ type: 'customer.subscription.deleted' })
    expect(deleted.data.map((e) => (e.data.object as Stripe.Subscription).id)).toContain(ending.id)
    expect((await stripe.invoices.list({ subscription: ending.id })).data).toHaveLength(1)
  })
})
