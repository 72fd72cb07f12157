import type { Params } from './form.ts'
import type { Obj, Store } from './store.ts'
import { clone } from './store.ts'
import { newId } from './ids.ts'

/** Everything a resource handler may use. Events are collected and stored when the request commits. */
export interface Ctx {
  store: Store
  now(): number
  params: Record<string, string>
  body: Params
  baseUrl: string
  apiVersion: string
  request: { id: string | null; idempotency_key: string | null }
  events: Obj[]
  /** Subscriptions whose `customer.subscription.updated` the current handler emits itself (one event per change). */
  quiet: Set<string>
}

export function emit(ctx: Ctx, type: string, object: Obj, previous?: Obj, at?: number): void {
  const event = {
    id: newId('evt'), object: 'event', api_version: ctx.apiVersion, created: ctx.now(),
    data: { object: clone(object), ...(previous ? { previous_attributes: previous } : {}) },
    livemode: false, pending_webhooks: 0, request: { ...ctx.request }, type,
  }
  if (at === undefined) ctx.events.push(event)
  else ctx.events.splice(at, 0, event)
}

/** Top-level fields whose value changed, with their old value (Stripe's `previous_attributes`). */
export function previousAttributes(before: Obj, after: Obj): Obj | undefined {
  const prev: Obj = {}
  for (const key of Object.keys(after)) {
    if (JSON.stringify(before[key]) !== JSON.stringify(after[key])) prev[key] = before[key] ?? null
  }
  return Object.keys(prev).length ? prev : undefined
}
