import { createServer, type IncomingMessage, type Server } from 'node:http'
import type { AddressInfo } from 'node:net'
import Stripe from 'stripe'
import { FakeStripe, type FakeStripeOptions } from '~~/fakes/stripe/app.ts'

export const TEST_KEY = 'sk_test_knotwork_unit'

export async function startFakeStripe(options: FakeStripeOptions = {}): Promise<{ fake: FakeStripe; port: number; stripe: Stripe; base: string }> {
  const fake = new FakeStripe(options)
  const port = await fake.listen(0)
  return { fake, port, stripe: client(port), base: `http://127.0.0.1:${port}` }
}

/** The real SDK, pointed at the fake exactly as the app will be in development. */
export function client(port: number, key = TEST_KEY): Stripe {
  return new Stripe(key, { host: '127.0.0.1', port, protocol: 'http', maxNetworkRetries: 0, telemetry: false })
}

export async function advance(base: string, seconds: number): Promise<void> {
  const res = await fetch(`${base}/_test/advance`, { method: 'POST', headers: { 'Content-Type': 'application/json' }, body: JSON.stringify({ seconds }) })
  if (!res.ok) throw new Error(`advance failed: ${res.status}`)
}

export interface Received { raw: string; signature: string; status: number }

/** A webhook receiver; `answer(n)` gives the status for the n-th request (1-based). */
export async function startReceiver(answer: (n: number) => number): Promise<{ server: Server; url: string; received: Received[] }> {
  const received: Received[] = []
  const server = createServer((req: IncomingMessage, res) => {
    const chunks: Buffer[] = []
    req.on('data', (c: Buffer) => chunks.push(c))
    req.on('end', () => {
      const status = answer(received.length + 1)
      received.push({ raw: Buffer.concat(chunks).toString('utf8'), signature: String(req.headers['stripe-signature'] ?? ''), status })
      res.writeHead(status).end()
    })
  })
  await new Promise<void>((r) => server.listen(0, '127.0.0.1', () => r()))
  return { server, url: `http://127.0.0.1:${(server.address() as AddressInfo).port}/hook`, received }
}

/** Product "Seat" with a monthly per-unit price, and a customer whose default card is `pmToken`. */
export async function seatSetup(stripe: Stripe, unitAmount: number, pmToken: string) {
  const product = await stripe.products.create({ name: 'Seat' })
  const price = await stripe.prices.create({ product: product.id, currency: 'usd', unit_amount: unitAmount, recurring: { interval: 'month' } })
  const customer = await stripe.customers.create({ email: 'billing@larkspur.example', name: 'Larkspur Mutual', metadata: { org: 'org_1' } })
  const pm = await stripe.paymentMethods.attach(pmToken, { customer: customer.id })
  await stripe.customers.update(customer.id, { invoice_settings: { default_payment_method: pm.id } })
  return { product, price, customer, pm }
}
