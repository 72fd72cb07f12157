import type { IncomingMessage, ServerResponse } from 'node:http'
import type { FakeStripe } from '../app.ts'
import { StripeApiError } from '../errors.ts'
import { page } from '../html.ts'
import { readBody, redirect, sendHtml } from '../http.ts'
import { invoicePage, payFromPage } from './invoice.ts'
import { safeReturnUrl, saveCard, setupForm } from './setup.ts'

/** Browser pages: `/hosted/setup` (card entry) and `/hosted/invoices/:id` (invoice with a Pay button). */
export async function handleHosted(app: FakeStripe, req: IncomingMessage, res: ServerResponse, url: URL): Promise<void> {
  const path = url.pathname
  if (path === '/hosted/setup' && req.method === 'GET') {
    const customer = url.searchParams.get('customer') ?? ''
    const returnUrl = safeReturnUrl(url.searchParams.get('return_url'))
    if (!app.store.get('customers', customer) || !returnUrl) return sendHtml(res, 400, page('Error', '<h1>Link not valid</h1><p>A customer id and an http(s) return_url are required.</p>'))
    return sendHtml(res, 200, setupForm(customer, returnUrl))
  }
  if (path === '/hosted/setup' && req.method === 'POST') {
    const form = new URLSearchParams(await readBody(req))
    try {
      return redirect(res, saveCard(app, form))
    } catch (err) {
      if (!(err instanceof StripeApiError)) throw err
      const values = { name: form.get('name') ?? '', number: form.get('number') ?? '', exp: form.get('exp') ?? '', cvc: '' }
      return sendHtml(res, err.status, setupForm(form.get('customer') ?? '', form.get('return_url') ?? '', err.body.message, values))
    }
  }
  const m = /^\/hosted\/invoices\/([^/]+)(\/pay)?$/.exec(path)
  const inv = m ? app.store.get('invoices', m[1]!) : undefined
  if (!m || !inv || inv.status === 'draft') return sendHtml(res, 404, page('Not found', '<h1>Not found</h1>'))
  if (m[2] && req.method === 'POST') {
    const result = payFromPage(app, inv.id)
    return redirect(res, `/hosted/invoices/${inv.id}?${new URLSearchParams({ result: result.ok ? 'ok' : 'failed', message: result.text })}`)
  }
  const result = url.searchParams.get('result')
  const message = result ? { ok: result === 'ok', text: url.searchParams.get('message') ?? '' } : undefined
  app.runDue()
  return sendHtml(res, 200, invoicePage(app, app.store.get('invoices', inv.id)!, message))
}
