/**
 * Local fake of the Stripe API for development and tests: `npx tsx fakes/stripe/server.ts`.
 * Env: FAKE_STRIPE_PORT (0 = any free port), FAKE_STRIPE_HOST (127.0.0.1), FAKE_STRIPE_STATE (JSON state file),
 * FAKE_STRIPE_WEBHOOK_URL + FAKE_STRIPE_WEBHOOK_SECRET, FAKE_STRIPE_WEBHOOK_RETRY_BASE_MS (1000),
 * FAKE_STRIPE_WEBHOOK_MAX_ATTEMPTS (5), FAKE_STRIPE_WEBHOOK_TIMEOUT_MS (10000), FAKE_STRIPE_PUBLIC_URL,
 * FAKE_STRIPE_PORT_FILE (the bound port is written there), FAKE_STRIPE_DUNNING_FINAL (cancel | unpaid | past_due).
 */
import { writeFileSync } from 'node:fs'
import { FakeStripe } from './app.ts'

const env = process.env
const num = (v: string | undefined, d: number) => (v === undefined || v === '' ? d : Number(v))
const app = new FakeStripe({
  stateFile: env.FAKE_STRIPE_STATE || undefined,
  webhookUrl: env.FAKE_STRIPE_WEBHOOK_URL || undefined,
  webhookSecret: env.FAKE_STRIPE_WEBHOOK_SECRET || undefined,
  retryBaseMs: num(env.FAKE_STRIPE_WEBHOOK_RETRY_BASE_MS, 1000),
  maxAttempts: num(env.FAKE_STRIPE_WEBHOOK_MAX_ATTEMPTS, 5),
  timeoutMs: num(env.FAKE_STRIPE_WEBHOOK_TIMEOUT_MS, 10000),
  publicUrl: env.FAKE_STRIPE_PUBLIC_URL || undefined,
  log: (line) => console.log(`${new Date().toISOString()} ${line}`),
})

const port = await app.listen(num(env.FAKE_STRIPE_PORT, 0), env.FAKE_STRIPE_HOST || '127.0.0.1')
if (env.FAKE_STRIPE_PORT_FILE) writeFileSync(env.FAKE_STRIPE_PORT_FILE, `${port}\n`)
console.log(`fake-stripe listening on ${app.baseUrl} (webhooks → ${env.FAKE_STRIPE_WEBHOOK_URL || 'API-configured endpoints only'})`)

// Renewals also fall due as real time passes.
setInterval(() => { try { app.runDue() } catch (e) { console.error(e) } }, 30000).unref()

for (const sig of ['SIGINT', 'SIGTERM'] as const) {
  process.on(sig, () => { void app.close().finally(() => process.exit(0)) })
}
