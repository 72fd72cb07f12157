/**
 * Local SMTP fake with an HTTP inbox: `npx tsx fakes/smtp/server.ts`.
 * Env: FAKE_SMTP_HOST (127.0.0.1), FAKE_SMTP_PORT (0 = any free port), FAKE_SMTP_HTTP_PORT (0),
 * FAKE_SMTP_STORE (JSON-lines file the messages are appended to and read back from),
 * FAKE_SMTP_PORT_FILE (receives `{"smtp":<port>,"http":<port>}`).
 */
import { writeFileSync } from 'node:fs'
import { FakeSmtp } from './app.ts'

const env = process.env
const app = new FakeSmtp({ storeFile: env.FAKE_SMTP_STORE || undefined, log: (l) => console.log(`${new Date().toISOString()} ${l}`) })
const host = env.FAKE_SMTP_HOST || '127.0.0.1'
const ports = await app.listen(Number(env.FAKE_SMTP_PORT || 0), Number(env.FAKE_SMTP_HTTP_PORT || 0), host)
if (env.FAKE_SMTP_PORT_FILE) writeFileSync(env.FAKE_SMTP_PORT_FILE, `${JSON.stringify(ports)}\n`)
console.log(`fake-smtp: SMTP on ${host}:${ports.smtp}, inbox on http://${host}:${ports.http}/`)

for (const sig of ['SIGINT', 'SIGTERM'] as const) {
  process.on(sig, () => { void app.close().finally(() => process.exit(0)) })
}
