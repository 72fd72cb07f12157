import type { IncomingMessage, ServerResponse } from 'node:http'
import type { FakeStripe } from './app.ts'
import { invalid } from './errors.ts'
import { parseForm } from './form.ts'
import { readBody, sendJson } from './http.ts'

async function params(req: IncomingMessage): Promise<Record<string, unknown>> {
  const raw = await readBody(req)
  if (!raw) return {}
  return (req.headers['content-type'] ?? '').includes('json') ? JSON.parse(raw) : parseForm(raw)
}

/**
 * Test-only controls (no API key): `POST /_test/advance {seconds}` moves the fake clock and runs what falls due,
 * `GET /_test/state`, `POST /_test/reset`, `GET /_test/webhooks` (delivery log), `POST /_test/webhooks/idle`.
 */
export async function handleTest(app: FakeStripe, req: IncomingMessage, res: ServerResponse, url: URL): Promise<void> {
  const route = `${req.method} ${url.pathname}`
  if (route === 'POST /_test/advance') {
    const p = await params(req)
    const seconds = Number(p.seconds ?? 0)
    if (!Number.isInteger(seconds) || seconds < 0) throw invalid('seconds must be a non-negative integer', 'seconds')
    app.store.state.clockOffset += seconds
    app.runDue()
    return sendJson(res, 200, { now: app.now(), clock_offset: app.store.state.clockOffset })
  }
  if (route === 'GET /_test/state') {
    const { idempotency, endpointSecrets: _secrets, ...rest } = app.store.state
    return sendJson(res, 200, { now: app.now(), ...rest, idempotency_keys: Object.keys(idempotency).length, webhook_deliveries: app.webhooks.deliveries })
  }
  if (route === 'POST /_test/reset') {
    app.webhooks.close()
    app.webhooks.deliveries.length = 0
    app.store.reset()
    return sendJson(res, 200, { ok: true })
  }
  if (route === 'GET /_test/webhooks') return sendJson(res, 200, { data: app.webhooks.deliveries })
  if (route === 'POST /_test/webhooks/idle') {
    await Promise.race([app.webhooks.idle(), new Promise((r) => setTimeout(r, 60000))])
    return sendJson(res, 200, { data: app.webhooks.deliveries })
  }
  sendJson(res, 404, { error: { type: 'invalid_request_error', message: `Unknown test route ${route}` } })
}
