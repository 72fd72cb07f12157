import type { IncomingMessage, ServerResponse } from 'node:http'
import qs from 'qs'
import { DEFAULT_API_VERSION, type FakeStripe } from './app.ts'
import type { Ctx } from './context.ts'
import { StripeApiError } from './errors.ts'
import { expandObject } from './expand.ts'
import { parseForm } from './form.ts'
import { errorBody, readBody, sendJson } from './http.ts'
import { fingerprint, remember, replayFor } from './idempotency.ts'
import { expandParam } from './params.ts'
import { matchRoute } from './router.ts'

function authError(message: string): StripeApiError {
  return new StripeApiError(401, { type: 'invalid_request_error', message })
}

/** Any `sk_test_...` key is accepted (Bearer, or Basic with the key as user name). */
function checkAuth(req: IncomingMessage): void {
  const h = req.headers.authorization ?? ''
  let key = ''
  if (h.startsWith('Bearer ')) key = h.slice(7).trim()
  else if (h.startsWith('Basic ')) key = Buffer.from(h.slice(6), 'base64').toString('utf8').split(':')[0] ?? ''
  if (!key) throw authError('You did not provide an API key. You need to provide your API key in the Authorization header, using Bearer auth (e.g. \'Authorization: Bearer YOUR_SECRET_KEY\').')
  if (!/^sk_test_\w+$/.test(key)) throw authError(`Invalid API Key provided: ${key.slice(0, 8)}${'*'.repeat(Math.max(0, key.length - 12))}${key.slice(-4)}`)
}

/** Statuses whose answers are saved for an idempotency key (the request started executing). */
const SAVED = new Set([200, 402, 404])

export async function handleApi(app: FakeStripe, req: IncomingMessage, res: ServerResponse, url: URL, requestId: string): Promise<void> {
  const method = req.method ?? 'GET'
  const raw = await readBody(req)
  checkAuth(req)
  const match = matchRoute(method, url.pathname)
  if (!match) throw new StripeApiError(404, { type: 'invalid_request_error', message: `Unrecognized request URL (${method}: ${url.pathname}). The local Stripe fake does not implement it.` })
  const query = qs.parse(url.search.slice(1), { depth: 10, arrayLimit: 1000 }) as Record<string, unknown>
  const body = method === 'POST' ? { ...query, ...parseForm(raw) } : query
  const key = method === 'POST' ? (req.headers['idempotency-key'] as string | undefined) : undefined
  const apiVersion = (req.headers['stripe-version'] as string | undefined) ?? undefined
  const headers: Record<string, string> = { 'Request-Id': requestId, 'Stripe-Version': apiVersion ?? DEFAULT_API_VERSION }
  if (key && key.length > 255) throw new StripeApiError(400, { type: 'invalid_request_error', message: 'Idempotency keys can be at most 255 characters long.' })
  const print = key ? fingerprint(method, url.pathname, body) : ''
  const replay = key ? replayFor(app.store, key, print, app.now()) : undefined
  if (replay) return sendJson(res, replay.status, replay.body, { ...headers, 'Idempotent-Replayed': 'true', 'Original-Request': 'replayed' })
  app.runDue()
  let status = 200
  let text: string
  try {
    const init = { params: match.params, body, apiVersion, request: { id: requestId, idempotency_key: key ?? null } }
    const run = (ctx: Ctx) => expandObject(match.route.handler(ctx), expandParam(body), app.store)
    text = JSON.stringify(method === 'GET' ? run(app.context(init)) : app.tx(run, init))
  } catch (err) {
    if (!(err instanceof StripeApiError)) throw err
    status = err.status
    text = JSON.stringify(errorBody(err, requestId))
  }
  if (key && SAVED.has(status)) {
    remember(app.store, key, { fingerprint: print, status, body: text, created: app.now() })
    app.store.save()
  }
  app.log(`${method} ${url.pathname} → ${status}`)
  sendJson(res, status, text, headers)
}
