import Stripe from 'stripe'
import { afterEach, describe, expect, it } from 'vitest'
import type { Server } from 'node:http'
import { startFakeStripe, startReceiver } from './helpers.ts'

const SECRET = 'whsec_unit_test_secret_value'
const verifier = new Stripe('sk_test_verify_only')
const cleanup: Array<() => Promise<unknown> | void> = []
afterEach(async () => { for (const f of cleanup.splice(0)) await f() })

function closeServer(s: Server) { return new Promise((r) => s.close(r)) }

describe('webhook delivery', () => {
  it('signs events the way stripe.webhooks.constructEvent verifies, and retries a delivery answered 500', async () => {
    const rx = await startReceiver((n) => (n === 1 ? 500 : 200))
    const { fake, stripe } = await startFakeStripe({ webhookUrl: rx.url, webhookSecret: SECRET, retryBaseMs: 50 })
    cleanup.push(() => fake.close(), () => closeServer(rx.server))

    const customer = await stripe.customers.create({ email: 'ops@fenwickrowe.example' })
    await fake.webhooks.idle()
    expect(rx.received.map((r) => r.status)).toEqual([500, 200])
    const [first, second] = rx.received
    expect(second!.raw).toBe(first!.raw)
    for (const r of rx.received) {
      const event = verifier.webhooks.constructEvent(r.raw, r.signature, SECRET)
      expect(event.type).toBe('customer.created')
      expect((event.data.object as Stripe.Customer).id).toBe(customer.id)
    }
    expect(() => verifier.webhooks.constructEvent(second!.raw.replace('fenwickrowe', 'elsewhere'), second!.signature, SECRET)).toThrow()
    expect(() => verifier.webhooks.constructEvent(second!.raw, second!.signature, 'whsec_wrong')).toThrow()
    expect(fake.webhooks.deliveries.map((d) => [d.attempt, d.status])).toEqual([[1, 500], [2, 200]])

    const event = await stripe.events.retrieve(JSON.parse(first!.raw).id)
    expect(event.pending_webhooks).toBe(0)
  })

  it('gives up after the configured number of attempts when the receiver keeps failing', async () => {
    const rx = await startReceiver(() => 503)
    const { fake, stripe } = await startFakeStripe({ webhookUrl: rx.url, webhookSecret: SECRET, retryBaseMs: 20, maxAttempts: 3 })
    cleanup.push(() => fake.close(), () => closeServer(rx.server))
    await stripe.products.create({ name: 'Seat' })
    await fake.webhooks.idle()
    expect(rx.received).toHaveLength(3)
    // the backoff doubles (the schedule, not the observed gaps: on a loaded machine a slow answer stretches one gap)
    expect(fake.webhooks.deliveries.map((d) => d.retryInMs)).toEqual([20, 40, null])
    const at = fake.webhooks.deliveries.map((d) => Date.parse(d.at))
    expect(at[1]! - at[0]!).toBeGreaterThanOrEqual(20 - 1)
    expect(at[2]! - at[1]!).toBeGreaterThanOrEqual(40 - 1)
  })

  it('delivers only enabled events to an endpoint created through the API, signed with its own secret', async () => {
    const rx = await startReceiver(() => 200)
    const { fake, stripe } = await startFakeStripe()
    cleanup.push(() => fake.close(), () => closeServer(rx.server))
    const endpoint = await stripe.webhookEndpoints.create({ url: rx.url, enabled_events: ['invoice.paid', 'customer.subscription.created'] })
    expect(endpoint.secret).toMatch(/^whsec_/)
    const product = await stripe.products.create({ name: 'Seat' })
    const price = await stripe.prices.create({ product: product.id, currency: 'eur', unit_amount: 900, recurring: { interval: 'month' } })
    const customer = await stripe.customers.create({ payment_method: 'pm_card_visa' } as Stripe.CustomerCreateParams)
    const [pm] = (await stripe.customers.listPaymentMethods(customer.id)).data
    await stripe.customers.update(customer.id, { invoice_settings: { default_payment_method: pm!.id } })
    await stripe.subscriptions.create({ customer: customer.id, items: [{ price: price.id, quantity: 2 }] })
    await fake.webhooks.idle()
    const types = rx.received.map((r) => verifier.webhooks.constructEvent(r.raw, r.signature, endpoint.secret!).type).sort()
    expect(types).toEqual(['customer.subscription.created', 'invoice.paid'])
  })
})
