// Test access to the local fakes that scripts/test.sh started (fakes.env): the fake inbox over its HTTP API, and the
// Stripe SDK pointed at the fake Stripe server (to read the truth and to sign webhook payloads).
import Stripe from 'stripe'
import { BASE } from './helpers'

const env = process.env
export const INBOX = (env.KW_MAIL_INBOX_URL ?? '').replace(/\/+$/, '')
export const WEBHOOK_SECRET = env.KW_STRIPE_WEBHOOK_SECRET ?? ''

export const stripe = new Stripe(env.KW_STRIPE_SECRET_KEY ?? 'sk_test_missing', {
  host: env.KW_STRIPE_HOST ?? '127.0.0.1', port: Number(env.KW_STRIPE_PORT ?? 0), protocol: 'http', maxNetworkRetries: 0, telemetry: false,
})

export interface Mail { id: string; to: string[]; subject: string; text: string; html: string | null }

/** The newest message to an address whose subject contains the words; waits up to 10 s for it to arrive. */
export async function waitForMail(to: string, subject: string, notId?: string): Promise<Mail> {
  for (let i = 0; i < 100; i++) {
    const res = await fetch(`${INBOX}/messages?${new URLSearchParams({ to, subject })}`)
    const list = await res.json() as Mail[]
    const found = list.find(m => m.id !== notId)
    if (found) return found
    await new Promise(r => setTimeout(r, 100))
  }
  throw new Error(`no mail to ${to} about "${subject}" in ${INBOX}`)
}

export async function mailsTo(to: string): Promise<Mail[]> {
  return await (await fetch(`${INBOX}/messages?${new URLSearchParams({ to })}`)).json() as Mail[]
}

/** The token at the end of a link to the given path in a mail's text (e.g. /invitations/<token>). */
export function tokenIn(mail: Mail, path: string): string {
  const m = new RegExp(`${BASE.replace(/[.:/]/g, '\\$&')}${path}/([A-Za-z0-9_-]+)`).exec(mail.text)
  if (!m) throw new Error(`no ${path} link in: ${mail.text}`)
  return m[1]!
}

/** Posts a payload to the app's webhook signed as Stripe signs it (optionally with another secret or time). */
export async function postWebhook(payload: string, o: { secret?: string; timestamp?: number } = {}) {
  const header = stripe.webhooks.generateTestHeaderString({ payload, secret: o.secret ?? WEBHOOK_SECRET, timestamp: o.timestamp })
  const res = await fetch(`${BASE}/api/webhooks/stripe`, { method: 'POST', body: payload, headers: { 'content-type': 'application/json', 'stripe-signature': header } })
  return { status: res.status, body: await res.json().catch(() => null) as { outcome?: string } | null }
}
