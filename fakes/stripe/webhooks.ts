import { createHmac } from 'node:crypto'
import type { Obj, Store } from './store.ts'
import { typeMatches } from './resources/events.ts'

export interface WebhookOptions {
  store: Store
  /** Endpoint from the environment (FAKE_STRIPE_WEBHOOK_URL / FAKE_STRIPE_WEBHOOK_SECRET); receives every event. */
  envEndpoint?: { url: string; secret: string }
  baseDelayMs: number
  maxAttempts: number
  timeoutMs: number
  log: (line: string) => void
}

export interface Delivery {
  event: string; type: string; url: string; attempt: number; status: number | null; error: string | null; at: string
  /** When the next attempt is due after this one (ms), or null when there is none (delivered, or attempts used up). */
  retryInMs: number | null
}

/** Stripe's scheme: `t=<unix>,v1=<hex HMAC-SHA256(secret, "<t>.<payload>")>`. The time is real time, not the fake clock. */
export function signatureHeader(payload: string, secret: string, t = Math.floor(Date.now() / 1000)): string {
  return `t=${t},v1=${createHmac('sha256', secret).update(`${t}.${payload}`, 'utf8').digest('hex')}`
}

/** Delivers events to endpoints, retrying non-2xx answers and connection errors with exponential backoff. */
export class WebhookDispatcher {
  readonly deliveries: Delivery[] = []
  private pending = 0
  private timers = new Set<NodeJS.Timeout>()
  private idleWaiters: Array<() => void> = []

  constructor(private o: WebhookOptions) {}

  private targets(event: Obj): Array<{ url: string; secret: string }> {
    const out: Array<{ url: string; secret: string }> = []
    if (this.o.envEndpoint?.url) out.push(this.o.envEndpoint)
    for (const we of this.o.store.all('webhook_endpoints').reverse()) {
      const secret = this.o.store.state.endpointSecrets[we.id]
      if (we.status === 'enabled' && secret && we.enabled_events.some((p: string) => typeMatches(p, event.type))) out.push({ url: we.url, secret })
    }
    return out
  }

  dispatch(event: Obj): void {
    const targets = this.targets(event)
    event.pending_webhooks = targets.length
    for (const t of targets) { this.pending++; void this.attempt(event, t.url, t.secret, 1) }
  }

  private async attempt(event: Obj, url: string, secret: string, attempt: number): Promise<void> {
    const payload = JSON.stringify(this.o.store.get('events', event.id) ?? event, null, 2)
    let status: number | null = null
    let error: string | null = null
    try {
      const res = await fetch(url, {
        method: 'POST', body: payload, signal: AbortSignal.timeout(this.o.timeoutMs),
        headers: { 'Content-Type': 'application/json; charset=utf-8', 'Stripe-Signature': signatureHeader(payload, secret), 'User-Agent': 'Stripe/1.0 (+https://stripe.com/docs/webhooks)' },
      })
      status = res.status
      await res.arrayBuffer().catch(() => undefined)
    } catch (e) {
      error = (e as Error).message
    }
    const ok = status !== null && status >= 200 && status < 300
    const retryInMs = ok || attempt >= this.o.maxAttempts ? null : this.o.baseDelayMs * 2 ** (attempt - 1)
    this.deliveries.push({ event: event.id, type: event.type, url, attempt, status, error, at: new Date().toISOString(), retryInMs })
    if (this.deliveries.length > 1000) this.deliveries.splice(0, this.deliveries.length - 1000)
    this.o.log(`webhook ${event.type} ${event.id} → ${url} attempt ${attempt}: ${ok ? status : error ?? status}`)
    if (retryInMs === null) {
      if (ok) {
        const stored = this.o.store.get('events', event.id)
        if (stored) stored.pending_webhooks = Math.max(0, stored.pending_webhooks - 1)
      }
      this.done()
      return
    }
    const timer = setTimeout(() => { this.timers.delete(timer); void this.attempt(event, url, secret, attempt + 1) }, retryInMs)
    this.timers.add(timer)
  }

  private done(): void {
    this.pending--
    if (this.pending === 0) for (const w of this.idleWaiters.splice(0)) w()
  }

  /** Resolves when no delivery is in flight or waiting for a retry. */
  idle(): Promise<void> {
    return this.pending === 0 ? Promise.resolve() : new Promise((r) => this.idleWaiters.push(r))
  }

  close(): void {
    for (const t of this.timers) clearTimeout(t)
    this.timers.clear()
    this.pending = 0
    for (const w of this.idleWaiters.splice(0)) w()
  }
}
