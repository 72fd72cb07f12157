import { createHash } from 'node:crypto'
import { StripeApiError } from './errors.ts'
import type { Params } from './form.ts'
import type { IdempotencyRecord, Store } from './store.ts'

/** Stripe keeps keys for at least 24 hours. */
const TTL = 24 * 3600
const MAX_KEYS = 20000

function canonical(v: unknown): unknown {
  if (Array.isArray(v)) return v.map(canonical)
  if (v && typeof v === 'object') return Object.fromEntries(Object.keys(v).sort().map((k) => [k, canonical((v as Params)[k])]))
  return v
}

/** Same method, path and parameters (order-insensitive) give the same fingerprint. */
export function fingerprint(method: string, path: string, body: Params): string {
  return createHash('sha256').update(JSON.stringify([method, path, canonical(body)])).digest('hex')
}

/** The saved answer for a repeated key, or a 400 idempotency_error when the parameters differ. */
export function replayFor(store: Store, key: string, print: string, now: number): IdempotencyRecord | undefined {
  const rec = store.state.idempotency[key]
  if (!rec || rec.created + TTL < now) return undefined
  if (rec.fingerprint !== print) {
    throw new StripeApiError(400, {
      type: 'idempotency_error',
      message: `Keys for idempotent requests can only be used with the same parameters they were first used with. Try using a key other than '${key}' if you meant to execute a different request.`,
    })
  }
  return rec
}

export function remember(store: Store, key: string, rec: IdempotencyRecord): void {
  const all = store.state.idempotency
  all[key] = rec
  const keys = Object.keys(all)
  for (const k of keys) if (all[k]!.created + TTL < rec.created) delete all[k]
  for (const k of Object.keys(all).slice(0, Math.max(0, Object.keys(all).length - MAX_KEYS))) delete all[k]
}
