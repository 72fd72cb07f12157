import { randomUUID } from 'node:crypto'
import { afterAll, describe, expect, it } from 'vitest'
import { DEMO, FENWICK, closeOwnerDb, count, freshOrg, ownerDb, signedIn } from './helpers'
import { stripe } from './fakes'
import type { SeatsPreviewDto } from '#shared/types/api'

afterAll(closeOwnerDb)

interface Billing {
  seats: { purchased: number; used: number }
  status: string
  card: { brand: string; last4: string } | null
  cardEntryUrl: string | null
  invoices: { id: string; status: string; reason: string; amountDue: number; currency: string }[]
}

async function customerOf(slug: string): Promise<{ customer: string; subscription: string }> {
  const [rows] = await ownerDb().query('SELECT b.stripe_customer_id AS customer, b.stripe_subscription_id AS subscription FROM billing_accounts b JOIN organisations o ON o.id = b.org_id WHERE o.slug = :slug', { replacements: { slug } })
  return (rows as { customer: string; subscription: string }[])[0]!
}

describe('billing', () => {
  it('starts a Stripe customer and a trial subscription the first time billing is opened', async () => {
    const { client, slug } = await freshOrg()
    expect(await count('SELECT 1 FROM billing_accounts b JOIN organisations o ON o.id = b.org_id WHERE o.slug = :slug AND b.stripe_customer_id IS NOT NULL', { slug })).toBe(0)
    const r = await client.get<Billing>(`/api/orgs/${slug}/billing`)
    expect(r.status).toBe(200)
    expect(r.body).toMatchObject({ status: 'trialing', seats: { purchased: 3, used: 1 }, card: null })
    const { customer, subscription } = await customerOf(slug)
    const sub = await stripe.subscriptions.retrieve(subscription)
    expect(sub.customer).toBe(customer)
    expect(sub.items.data[0]!.quantity).toBe(3)
    expect(sub.items.data[0]!.price.unit_amount).toBe(4900)
    expect(r.body.cardEntryUrl).toContain(`/hosted/setup?customer=${customer}`)
    // opening again does not start a second subscription
    await client.get(`/api/orgs/${slug}/billing`)
    expect((await stripe.subscriptions.list({ customer, status: 'all' })).data).toHaveLength(1)
  })

  it('changes seats through the subscription with an invoiced proration, once per request key', async () => {
    const admin = await signedIn(DEMO.otherAdmin)
    const before = await admin.get<Billing>(`/api/orgs/${FENWICK}/billing`)
    expect(before.body.card).toMatchObject({ brand: 'visa', last4: '4242' })
    const start = before.body.seats.purchased
    const key = randomUUID()
    expect((await admin.post(`/api/orgs/${FENWICK}/billing/seats`, { seats: start + 1, requestKey: key })).status).toBe(200)
    const after = await admin.get<Billing>(`/api/orgs/${FENWICK}/billing`)
    expect(after.body.seats.purchased).toBe(start + 1)
    const prorations = after.body.invoices.filter(i => i.reason === 'subscription_update')
    expect(prorations.length).toBe(before.body.invoices.filter(i => i.reason === 'subscription_update').length + 1)
    // one more seat for the rest of the month: more than nothing, at most one seat's monthly price
    expect(prorations[0]!.amountDue).toBeGreaterThan(0)
    expect(prorations[0]!.amountDue).toBeLessThanOrEqual(4900)
    expect(prorations[0]!.status).toBe('paid')
    const { subscription } = await customerOf(FENWICK)
    expect((await stripe.subscriptions.retrieve(subscription)).items.data[0]!.quantity).toBe(start + 1)
    expect(await count(`SELECT 1 FROM audit_events a JOIN organisations o ON o.id = a.org_id WHERE o.slug = :slug AND a.action = 'billing.seats-change'`, { slug: FENWICK })).toBeGreaterThan(0)
    // going below the seats in use is refused
    const low = await admin.post<{ statusMessage: string }>(`/api/orgs/${FENWICK}/billing/seats`, { seats: 1 })
    expect(low.status).toBe(409)
    expect(low.body.statusMessage).toContain('in use')
  })

  it('previews what a change of seats will charge (the payment service\u2019s own preview), and the confirmed change charges exactly that', async () => {
    const admin = await signedIn(DEMO.otherAdmin)
    const before = await admin.get<Billing>(`/api/orgs/${FENWICK}/billing`)
    const start = before.body.seats.purchased
    const preview = await admin.post<SeatsPreviewDto>(`/api/orgs/${FENWICK}/billing/seats-preview`, { seats: start + 2 })
    expect(preview.status).toBe(200)
    expect(preview.body).toMatchObject({ from: start, to: start + 2, currency: 'eur', monthlyAfter: 4900 * (start + 2), card: { last4: '4242' }, trial: false })
    // two more seats for the rest of the period: more than nothing, at most two seats' monthly price
    expect(preview.body.amountDue).toBeGreaterThan(0)
    expect(preview.body.amountDue).toBeLessThanOrEqual(2 * 4900)
    // nothing changed yet
    expect((await admin.get<Billing>(`/api/orgs/${FENWICK}/billing`)).body.seats.purchased).toBe(start)
    const changed = await admin.post(`/api/orgs/${FENWICK}/billing/seats`, { seats: start + 2, requestKey: randomUUID(), prorationDate: preview.body.prorationDate })
    expect(changed.status).toBe(200)
    const after = await admin.get<Billing>(`/api/orgs/${FENWICK}/billing`)
    const newest = after.body.invoices.filter(i => i.reason === 'subscription_update')[0]!
    expect(newest.amountDue).toBe(preview.body.amountDue)
    // a price worked out too long ago is not charged as it is
    const old = await admin.post<{ data: { code: string } }>(`/api/orgs/${FENWICK}/billing/seats`, { seats: start + 3, prorationDate: Math.floor(Date.now() / 1000) - 7200 })
    expect([old.status, old.body.data.code]).toEqual([409, 'reload-needed'])
    expect((await admin.post(`/api/orgs/${FENWICK}/billing/seats-preview`, { seats: 1 })).status).toBe(409)
  })

  it('shows a failed payment to administrators, and clears it when the invoice is paid', async () => {
    const admin = await signedIn(DEMO.otherAdmin)
    await admin.get(`/api/orgs/${FENWICK}/billing`)
    const { customer, subscription } = await customerOf(FENWICK)
    // Stripe's documented test card that attaches but is declined when charged
    const failing = await stripe.paymentMethods.attach('pm_card_chargeCustomerFail', { customer })
    await stripe.customers.update(customer, { invoice_settings: { default_payment_method: failing.id } })
    const seats = (await admin.get<Billing>(`/api/orgs/${FENWICK}/billing`)).body.seats.purchased
    expect((await admin.post(`/api/orgs/${FENWICK}/billing/seats`, { seats: seats + 1 })).status).toBe(200)
    const status = await admin.get<{ status: string; attention: boolean }>(`/api/orgs/${FENWICK}/billing/status`)
    expect(status.body).toEqual({ status: 'past_due', attention: true })
    expect((await (await signedIn('ravi.desai@fenwickrowe.example')).get(`/api/orgs/${FENWICK}/billing/status`)).status).toBe(403)
    // a working card, then the open invoice is paid: back in good standing (the webhook or the next read brings it)
    const good = await stripe.paymentMethods.attach('pm_card_visa', { customer })
    await stripe.customers.update(customer, { invoice_settings: { default_payment_method: good.id } })
    const open = await stripe.invoices.list({ customer, status: 'open' })
    for (const inv of open.data) await stripe.invoices.pay(inv.id!)
    expect((await stripe.subscriptions.retrieve(subscription)).status).toBe('active')
    const after = await admin.get<Billing>(`/api/orgs/${FENWICK}/billing`)
    expect(after.body.status).toBe('active')
    expect(after.body.invoices.every(i => i.status !== 'open')).toBe(true)
  })
})
