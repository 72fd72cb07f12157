// Test access to the local fakes that scripts/test.sh started (fakes.env): the fake inbox over its HTTP API, and the
// Stripe SDK pointed at the fake Stripe server (to read the truth and to sign webhook payloads).
import Stripe from 'stripe'
import { BASE } from './helpers'

export { INBOX, mailsTo, tokenIn, waitForMail, type Mail } from './inbox'

const env = process.env
export const WEBHOOK_SECRET = env.KW_STRIPE_WEBHOOK_SECRET ?? ''

export const stripe = new Stripe(env.KW_STRIPE_SECRET_KEY ?? 'sk_test_missing', {
  host: env.KW_STRIPE_HOST ?? '127.0.0.1', port: Number(env.KW_STRIPE_PORT ?? 0), protocol: 'http', maxNetworkRetries: 0, telemetry: false,
})

/** Posts a payload to the app's webhook signed as Stripe signs it (optionally with another secret or time). */
export async function postWebhook(payload: string, o: { secret?: string; timestamp?: number } = {}) {
  const header = stripe.webhooks.generateTestHeaderString({ payload, secret: o.secret ?? WEBHOOK_SECRET, timestamp: o.timestamp })
  const res = await fetch(`${BASE}/api/webhooks/stripe`, { method: 'POST', body: payload, headers: { 'content-type': 'application/json', 'stripe-signature': header } })
  return { status: res.status, body: await res.json().catch(() => null) as { outcome?: string } | null }
}
