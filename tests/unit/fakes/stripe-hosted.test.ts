import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type Stripe from 'stripe'
import { seatSetup, startFakeStripe } from './helpers.ts'
import type { FakeStripe } from '~~/fakes/stripe/app.ts'

let fake: FakeStripe
let stripe: Stripe
let base: string
const year = String((new Date().getUTCFullYear() + 3) % 100)

beforeAll(async () => ({ fake, stripe, base } = await startFakeStripe()))
afterAll(async () => fake.close())

function postForm(url: string, fields: Record<string, string>) {
  return fetch(url, { method: 'POST', redirect: 'manual', headers: { 'Content-Type': 'application/x-www-form-urlencoded' }, body: new URLSearchParams(fields) })
}

describe('hosted pages', () => {
  it('card entry: a declined card stays on the form, a good one becomes the default and redirects back', async () => {
    const customer = await stripe.customers.create({ email: 'admin@larkspur.example' })
    const returnUrl = 'http://127.0.0.1:3000/settings/billing?card=saved'
    const form = await fetch(`${base}/hosted/setup?customer=${customer.id}&return_url=${encodeURIComponent(returnUrl)}`)
    expect(form.status).toBe(200)
    expect(await form.text()).toContain('name="number"')

    const declined = await postForm(`${base}/hosted/setup`, { customer: customer.id, return_url: returnUrl, number: '4000 0000 0000 0002', exp: `12/${year}`, cvc: '123' })
    expect(declined.status).toBe(402)
    expect(await declined.text()).toContain('Your card was declined.')
    expect((await stripe.customers.listPaymentMethods(customer.id)).data).toHaveLength(0)

    const ok = await postForm(`${base}/hosted/setup`, { customer: customer.id, return_url: returnUrl, number: '4242 4242 4242 4242', exp: `12/${year}`, cvc: '123' })
    expect(ok.status).toBe(303)
    expect(ok.headers.get('location')).toBe(returnUrl)
    const after = await stripe.customers.retrieve(customer.id) as Stripe.Customer
    const pm = await stripe.paymentMethods.retrieve(after.invoice_settings.default_payment_method as string)
    expect(pm).toMatchObject({ customer: customer.id, card: { last4: '4242', brand: 'visa' } })
    expect(await (await fetch(`${base}/hosted/setup?customer=${customer.id}&return_url=javascript:alert(1)`)).status).toBe(400)
  })

  it('invoice page: Pay charges the default card and the incomplete subscription becomes active', async () => {
    const { price, customer } = await seatSetup(stripe, 2500, 'pm_card_chargeDeclined')
    const sub = await stripe.subscriptions.create({ customer: customer.id, items: [{ price: price.id, quantity: 2 }], expand: ['latest_invoice'] })
    const inv = sub.latest_invoice as Stripe.Invoice
    expect(sub.status).toBe('incomplete')
    const page = await (await fetch(inv.hosted_invoice_url!)).text()
    expect(page).toContain('$50.00')
    const failed = await postForm(`${inv.hosted_invoice_url}/pay`, {})
    expect(decodeURIComponent(failed.headers.get('location')!)).toContain('result=failed')

    const good = await stripe.paymentMethods.attach('pm_card_visa', { customer: customer.id })
    await stripe.customers.update(customer.id, { invoice_settings: { default_payment_method: good.id } })
    const paid = await postForm(`${inv.hosted_invoice_url}/pay`, {})
    expect(paid.headers.get('location')).toContain('result=ok')
    expect((await stripe.invoices.retrieve(inv.id)).status).toBe('paid')
    expect((await stripe.subscriptions.retrieve(sub.id)).status).toBe('active')
  })
})
