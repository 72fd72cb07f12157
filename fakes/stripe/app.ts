import { createServer, type IncomingMessage, type Server, type ServerResponse } from 'node:http'
import type { AddressInfo } from 'node:net'
import type { Ctx } from './context.ts'
import { StripeApiError } from './errors.ts'
import type { Params } from './form.ts'
import { errorBody, sendJson } from './http.ts'
import { newId } from './ids.ts'
import { Store, type Obj } from './store.ts'
import { WebhookDispatcher } from './webhooks.ts'
import { handleApi } from './api.ts'
import { handleHosted } from './hosted/index.ts'
import { handleTest } from './testing.ts'
import { hasDueWork, runDueWork } from './billing/renewal.ts'

/** The API version of the bundled SDK (stripe 23.1); used when a request names none. */
export const DEFAULT_API_VERSION = '2026-10-28.endive'

export interface FakeStripeOptions {
  stateFile?: string
  webhookUrl?: string
  webhookSecret?: string
  retryBaseMs?: number
  maxAttempts?: number
  timeoutMs?: number
  /** Base URL used in `hosted_invoice_url`; defaults to http://<host>:<port>. */
  publicUrl?: string
  log?: (line: string) => void
}

export interface TxInit { params?: Record<string, string>; body?: Params; apiVersion?: string; request?: Ctx['request'] }

export class FakeStripe {
  readonly store: Store
  readonly webhooks: WebhookDispatcher
  readonly server: Server
  baseUrl = ''
  readonly log: (line: string) => void

  constructor(readonly options: FakeStripeOptions = {}) {
    this.log = options.log ?? (() => {})
    this.store = new Store(options.stateFile)
    this.webhooks = new WebhookDispatcher({
      store: this.store, log: this.log,
      envEndpoint: options.webhookUrl ? { url: options.webhookUrl, secret: options.webhookSecret ?? '' } : undefined,
      baseDelayMs: options.retryBaseMs ?? 1000, maxAttempts: options.maxAttempts ?? 5, timeoutMs: options.timeoutMs ?? 10000,
    })
    if (options.webhookUrl && !options.webhookSecret?.startsWith('whsec_')) throw new Error('FAKE_STRIPE_WEBHOOK_SECRET must start with whsec_')
    this.server = createServer((req, res) => { void this.handle(req, res) })
  }

  now(): number {
    return Math.floor(Date.now() / 1000) + this.store.state.clockOffset
  }

  /**
   * Runs a state change atomically: on a thrown error the state is restored (unless the error says keepState),
   * otherwise the collected events are stored, the state is saved and the events are sent to webhook endpoints.
   */
  tx<T>(fn: (ctx: Ctx) => T, init: TxInit = {}): T {
    const snapshot = this.store.snapshot()
    const ctx = this.context(init)
    const commit = () => {
      for (const e of ctx.events) this.store.insert(e)
      this.store.save()
      for (const e of ctx.events) this.webhooks.dispatch(e as Obj)
    }
    try {
      const out = fn(ctx)
      commit()
      return out
    } catch (err) {
      if (err instanceof StripeApiError && err.keepState) commit()
      else this.store.restore(snapshot)
      throw err
    }
  }

  context(init: TxInit = {}): Ctx {
    return {
      store: this.store, now: () => this.now(), params: init.params ?? {}, body: init.body ?? {}, baseUrl: this.baseUrl,
      apiVersion: init.apiVersion ?? DEFAULT_API_VERSION, request: init.request ?? { id: null, idempotency_key: null },
      events: [], quiet: new Set(),
    }
  }

  /** Renewals, expiries and payment retries due at the fake's current time. */
  runDue(): void {
    if (hasDueWork(this.store, this.now())) this.tx((ctx) => runDueWork(ctx))
  }

  private async handle(req: IncomingMessage, res: ServerResponse): Promise<void> {
    const url = new URL(req.url ?? '/', 'http://fake.local')
    const requestId = newId('req', 14)
    try {
      if (url.pathname === '/_health') return sendJson(res, 200, { ok: true, service: 'fake-stripe', pid: process.pid })
      if (url.pathname.startsWith('/v1/')) return await handleApi(this, req, res, url, requestId)
      if (url.pathname.startsWith('/hosted/')) return await handleHosted(this, req, res, url)
      if (url.pathname.startsWith('/_test/')) return await handleTest(this, req, res, url)
      sendJson(res, 404, { error: { type: 'invalid_request_error', message: `Unrecognized request URL (${req.method}: ${url.pathname}).` } })
    } catch (err) {
      if (err instanceof StripeApiError) return sendJson(res, err.status, errorBody(err, requestId), { 'Request-Id': requestId })
      this.log(`error: ${(err as Error).stack}`)
      sendJson(res, 500, { error: { type: 'api_error', message: `Fake Stripe internal error: ${(err as Error).message}` } }, { 'Request-Id': requestId })
    }
  }

  async listen(port = 0, host = '127.0.0.1'): Promise<number> {
    await new Promise<void>((resolve, reject) => {
      this.server.once('error', reject)
      this.server.listen(port, host, () => { this.server.off('error', reject); resolve() })
    })
    const actual = (this.server.address() as AddressInfo).port
    this.baseUrl = this.options.publicUrl ?? `http://${host}:${actual}`
    return actual
  }

  async close(): Promise<void> {
    this.webhooks.close()
    await new Promise<void>((resolve) => this.server.close(() => resolve()))
    this.server.closeAllConnections?.()
  }
}
