import { randomBytes } from 'node:crypto'
import { afterAll, describe, expect, it } from 'vitest'
import type Stripe from 'stripe'
import { closeOwnerDb, count, freshOrg, ownerDb } from './helpers'
import { postWebhook, stripe } from './fakes'

afterAll(closeOwnerDb)

const evtId = () => `evt_test_${randomBytes(10).toString('hex')}`
function eventOf(type: string, object: { id?: string }): string {
  return JSON.stringify({ id: evtId(), object: 'event', api_version: '2026-10-28.endive', created: Math.floor(Date.now() / 1000), type, livemode: false, pending_webhooks: 1, request: { id: null, idempotency_key: null }, data: { object } })
}

async function local(slug: string) {
  const [acc] = await ownerDb().query(`SELECT b.org_id, b.seats, b.status, b.stripe_customer_id AS customer, b.stripe_subscription_id AS subscription
    FROM billing_accounts b JOIN organisations o ON o.id = b.org_id WHERE o.slug = :slug`, { replacements: { slug } })
  const account = (acc as { org_id: string; seats: number; status: string; customer: string; subscription: string }[])[0]!
  const [inv] = await ownerDb().query('SELECT stripe_invoice_id AS id, status, amount_due::int AS due, amount_paid::int AS paid FROM invoices WHERE org_id = :org ORDER BY stripe_invoice_id', { replacements: { org: account.org_id } })
  return { account, invoices: inv as { id: string; status: string; due: number; paid: number }[] }
}

/** Fisher-Yates with a seeded generator, so a failing order can be replayed. */
function shuffled<T>(items: T[], seed: number): T[] {
  const out = [...items]
  let s = seed
  const next = () => ((s = (s * 1103515245 + 12345) % 2 ** 31) / 2 ** 31)
  for (let i = out.length - 1; i > 0; i--) {
    const j = Math.floor(next() * (i + 1));
    [out[i], out[j]] = [out[j]!, out[i]!]
  }
  return out
}

describe('Stripe webhook', () => {
  it('refuses a bad signature and an altered body with 400', async () => {
    const payload = eventOf('customer.updated', { id: 'cus_nobody', object: 'customer' } as { id: string })
    expect((await postWebhook(payload, { secret: 'whsec_not_the_right_secret' })).status).toBe(400)
    const res = await fetch(`${process.env.KW_BASE_URL}/api/webhooks/stripe`, { method: 'POST', body: payload, headers: { 'content-type': 'application/json', 'stripe-signature': 't=1,v1=00' } })
    expect(res.status).toBe(400)
  })

  it('takes JSON only, as Stripe sends it (415 otherwise)', async () => {
    const payload = eventOf('customer.updated', { id: 'cus_nobody', object: 'customer' } as { id: string })
    const res = await fetch(`${process.env.KW_BASE_URL}/api/webhooks/stripe`, { method: 'POST', body: payload, headers: { 'content-type': 'text/plain', 'stripe-signature': 't=1,v1=00' } })
    expect(res.status).toBe(415)
  })

  it('refuses a timestamp older than 5 minutes (the SDK\u2019s default tolerance of 300 s)', async () => {
    const payload = eventOf('customer.updated', { id: 'cus_nobody', object: 'customer' } as { id: string })
    expect((await postWebhook(payload, { timestamp: Math.floor(Date.now() / 1000) - 301 })).status).toBe(400)
    expect((await postWebhook(payload, { timestamp: Math.floor(Date.now() / 1000) - 200 })).status).toBe(200)
  })

  it('refuses a timestamp more than 5 minutes in the future (the SDK checks only the past), and allows clock skew below that', async () => {
    const payload = eventOf('customer.updated', { id: 'cus_nobody', object: 'customer' } as { id: string })
    expect((await postWebhook(payload, { timestamp: Math.floor(Date.now() / 1000) + 600 })).status).toBe(400)
    expect((await postWebhook(payload, { timestamp: Math.floor(Date.now() / 1000) + 330 })).status).toBe(400)
    expect((await postWebhook(payload, { timestamp: Math.floor(Date.now() / 1000) + 60 })).status).toBe(200)
  })

  it('processes the same event once', async () => {
    const { client, slug } = await freshOrg()
    await client.get(`/api/orgs/${slug}/billing`)
    const { account } = await local(slug)
    const customer = await stripe.customers.retrieve(account.customer)
    const payload = eventOf('customer.updated', customer as Stripe.Customer)
    const id = (JSON.parse(payload) as { id: string }).id
    expect((await postWebhook(payload)).body?.outcome).toBe('processed')
    expect((await postWebhook(payload)).body?.outcome).toBe('duplicate')
    expect(await count('SELECT 1 FROM stripe_events WHERE id = :id', { id })).toBe(1)
  })

  it('shuffled, repeated and stale events converge on the same seats and invoices as Stripe holds', async () => {
    const { client, slug } = await freshOrg()
    await client.get(`/api/orgs/${slug}/billing`)
    const { account } = await local(slug)
    const stale = await stripe.subscriptions.retrieve(account.subscription) // 3 seats
    expect((await client.post(`/api/orgs/${slug}/billing/seats`, { seats: 5 })).status).toBe(200)
    const fresh = await stripe.subscriptions.retrieve(account.subscription)
    const invoices = (await stripe.invoices.list({ customer: account.customer })).data
    const customer = await stripe.customers.retrieve(account.customer)
    const truth = { seats: fresh.items.data[0]!.quantity, status: fresh.status, invoices: invoices.map(i => i.id).sort() }
    expect(truth.seats).toBe(5)

    const outcomes: unknown[] = []
    for (const seed of [7, 1234, 99991]) {
      // forget what we know, then replay: old and new subscription states, every invoice, the customer; some twice
      await ownerDb().query('UPDATE billing_accounts SET seats = 1, status = \'canceled\' WHERE org_id = :org', { replacements: { org: account.org_id } })
      await ownerDb().query('DELETE FROM invoices WHERE org_id = :org', { replacements: { org: account.org_id } })
      const events = [
        eventOf('customer.subscription.created', stale), eventOf('customer.subscription.updated', fresh),
        eventOf('customer.subscription.updated', stale), eventOf('customer.updated', customer as Stripe.Customer),
        ...invoices.flatMap(i => [eventOf('invoice.created', i), eventOf('invoice.paid', i)]),
      ]
      const sequence = shuffled([...events, ...events.slice(0, 3)], seed)
      for (const payload of sequence) expect((await postWebhook(payload)).status).toBe(200)
      const after = await local(slug)
      expect(after.account.seats).toBe(truth.seats)
      expect(after.account.status).toBe(truth.status)
      expect(after.invoices.map(i => i.id)).toEqual(truth.invoices)
      outcomes.push(after)
    }
    expect(outcomes[1]).toEqual(outcomes[0])
    expect(outcomes[2]).toEqual(outcomes[0])
  })

  it('records and ignores an event about a customer it does not know', async () => {
    const stranger = await stripe.customers.create({ name: 'Not one of ours' })
    const r = await postWebhook(eventOf('customer.updated', stranger))
    expect(r.status).toBe(200)
    expect(r.body?.outcome).toBe('ignored')
  })
})
