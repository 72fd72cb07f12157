import type { FakeStripe } from '../app.ts'
import { formatDate, formatMoney } from '../billing/money.ts'
import { attemptPayment } from '../billing/payment.ts'
import { esc, page } from '../html.ts'
import type { Obj } from '../store.ts'

export function invoicePage(app: FakeStripe, inv: Obj, message?: { ok: boolean; text: string }): string {
  const customer = app.store.get('customers', inv.customer) ?? {}
  const pmId = customer.invoice_settings?.default_payment_method
  const pm = pmId ? app.store.get('payment_methods', pmId) : undefined
  const lines = inv.lines.data.map((l: Obj) => `<tr><td>${esc(l.description)}</td><td class="n">${esc(formatMoney(l.amount, l.currency))}</td></tr>`).join('')
  const here = `${app.baseUrl}/hosted/invoices/${inv.id}`
  const pay = inv.status === 'open' || inv.status === 'uncollectible'
    ? `<p>Card on file: ${pm ? `${esc(pm.card.brand)} ending ${esc(pm.card.last4)}` : 'none'} · <a href="/hosted/setup?customer=${esc(encodeURIComponent(inv.customer))}&amp;return_url=${esc(encodeURIComponent(here))}">use another card</a></p>
<form method="post" action="/hosted/invoices/${esc(inv.id)}/pay"><button type="submit">Pay ${esc(formatMoney(inv.amount_remaining, inv.currency))}</button></form>`
    : ''
  return page(`Invoice ${inv.number ?? inv.id}`, `<h1>Invoice ${esc(inv.number ?? inv.id)}</h1>
${message ? `<p class="${message.ok ? 'ok' : 'err'}" role="status">${esc(message.text)}</p>` : ''}
<p>Status: <strong>${esc(inv.status)}</strong> · Issued ${esc(formatDate(inv.created))}${customer.email ? ` · ${esc(customer.email)}` : ''}</p>
<table>${lines}<tr><td><strong>Amount due</strong></td><td class="n"><strong>${esc(formatMoney(inv.amount_due, inv.currency))}</strong></td></tr>
<tr><td>Amount paid</td><td class="n">${esc(formatMoney(inv.amount_paid, inv.currency))}</td></tr></table>${pay}`)
}

/** Pays with the customer's default payment method; a decline is recorded (attempt, `invoice.payment_failed`). */
export function payFromPage(app: FakeStripe, invoiceId: string): { ok: boolean; text: string } {
  return app.tx((ctx) => {
    const inv = ctx.store.require('invoices', invoiceId, 'invoice')
    if (inv.status !== 'open' && inv.status !== 'uncollectible') return { ok: false, text: `This invoice is ${inv.status}.` }
    const err = attemptPayment(ctx, inv)
    return err ? { ok: false, text: err.body.message } : { ok: true, text: 'Payment received. Thank you.' }
  })
}
