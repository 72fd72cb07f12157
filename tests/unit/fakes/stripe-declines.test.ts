import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type Stripe from 'stripe'
import { advance, seatSetup, startFakeStripe } from './helpers.ts'
import type { FakeStripe } from '~~/fakes/stripe/app.ts'

// Test card numbers and their outcomes are Stripe's documented test cards (docs.stripe.com/testing, from memory):
// 4000000000000002 generic decline, 4000000000009995 insufficient_funds.
let fake: FakeStripe
let stripe: Stripe
let base: string

beforeAll(async () => ({ fake, stripe, base } = await startFakeStripe()))
afterAll(async () => fake.close())

async function eventsFor(type: string, objectId: string): Promise<Stripe.Event[]> {
  const list = await stripe.events.list({ type, limit: 100 })
  return list.data.filter((e) => (e.data.object as { id: string }).id === objectId)
}

describe('declined cards', () => {
  it('leaves the subscription incomplete with an open invoice, emits invoice.payment_failed, and pay answers 402', async () => {
    const { price, customer } = await seatSetup(stripe, 1200, 'pm_card_chargeDeclined')
    const sub = await stripe.subscriptions.create({ customer: customer.id, items: [{ price: price.id, quantity: 3 }] })
    expect(sub.status).toBe('incomplete')
    const inv = await stripe.invoices.retrieve(sub.latest_invoice as string)
    expect(inv.status).toBe('open')
    expect(inv.amount_due).toBe(3600)
    expect(inv.attempt_count).toBe(1)
    expect(await eventsFor('invoice.payment_failed', inv.id)).toHaveLength(1)

    const err = await stripe.invoices.pay(inv.id).catch((e: unknown) => e)
    expect(err).toMatchObject({ type: 'StripeCardError', statusCode: 402, code: 'card_declined', decline_code: 'generic_decline' })
    expect((await stripe.invoices.retrieve(inv.id)).attempt_count).toBe(2)
    expect(await eventsFor('invoice.payment_failed', inv.id)).toHaveLength(2)
  })

  it('answers 402 insufficient_funds with error_if_incomplete and creates no subscription', async () => {
    const { price, customer } = await seatSetup(stripe, 1200, 'pm_card_visa')
    const card = await stripe.paymentMethods.create({ type: 'card', card: { number: '4000000000009995', exp_month: 12, exp_year: new Date().getUTCFullYear() + 2, cvc: '123' } } as Stripe.PaymentMethodCreateParams)
    await stripe.paymentMethods.attach(card.id, { customer: customer.id })
    await expect(stripe.subscriptions.create({ customer: customer.id, items: [{ price: price.id }], default_payment_method: card.id, payment_behavior: 'error_if_incomplete' }))
      .rejects.toMatchObject({ type: 'StripeCardError', statusCode: 402, decline_code: 'insufficient_funds' })
    expect((await stripe.subscriptions.list({ customer: customer.id, status: 'all' })).data).toHaveLength(0)
  })

  it('turns an active subscription past_due when the renewal is declined, and active again once paid with a good card', async () => {
    const { price, customer } = await seatSetup(stripe, 500, 'pm_card_visa')
    const sub = await stripe.subscriptions.create({ customer: customer.id, items: [{ price: price.id, quantity: 4 }] })
    expect(sub.status).toBe('active')
    const bad = await stripe.paymentMethods.attach('pm_card_chargeCustomerFail', { customer: customer.id })
    await stripe.customers.update(customer.id, { invoice_settings: { default_payment_method: bad.id } })
    await advance(base, sub.items.data[0]!.current_period_end - Math.floor(Date.now() / 1000) + 3600)
    const after = await stripe.subscriptions.retrieve(sub.id)
    expect(after.status).toBe('past_due')
    const renewal = await stripe.invoices.retrieve(after.latest_invoice as string)
    expect(renewal).toMatchObject({ status: 'open', billing_reason: 'subscription_cycle', amount_due: 2000 })
    expect(renewal.next_payment_attempt).toBeGreaterThan(renewal.created)
    expect(await eventsFor('invoice.payment_failed', renewal.id)).toHaveLength(1)

    const good = await stripe.paymentMethods.attach('pm_card_visa', { customer: customer.id })
    const paid = await stripe.invoices.pay(renewal.id, { payment_method: good.id })
    expect(paid.status).toBe('paid')
    expect((await stripe.subscriptions.retrieve(sub.id)).status).toBe('active')
  })

  it('rejects an invalid card number as Stripe does (402 incorrect_number)', async () => {
    await expect(stripe.paymentMethods.create({ type: 'card', card: { number: '4242424242424241', exp_month: 1, exp_year: 2099 } } as Stripe.PaymentMethodCreateParams))
      .rejects.toMatchObject({ statusCode: 402, code: 'incorrect_number' })
  })
})
