import type { Params } from './form.ts'
import type { Collection, Obj, Store } from './store.ts'
import { allowOnly } from './params.ts'
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

/**
 * An update as Stripe answers it: `change` edits the object in place, then `<name>.updated` carries the fields that
 * changed (`previous_attributes`); with `onlyIfChanged`, an update that changed nothing sends no event.
 */
export function updateObject(ctx: Ctx, object: Obj, event: string, change: (o: Obj) => void, onlyIfChanged = false): Obj {
  const before = clone(object)
  change(object)
  const previous = previousAttributes(before, object)
  if (previous || !onlyIfChanged) emit(ctx, event, object, previous)
  return object
}

/** A new object with the request's fields applied (`apply`), announced as `<type>.created`. */
export function created(ctx: Ctx, type: string, object: Obj, apply: (ctx: Ctx, o: Obj) => void): Obj {
  apply(ctx, object)
  emit(ctx, `${type}.created`, object)
  return object
}

/** An update route: only `fields` allowed, the object or 404, `apply`, then `<type>.updated` (updateObject). */
export function updateRoute(coll: Collection, type: string, fields: string[], apply: (ctx: Ctx, o: Obj) => void, onlyIfChanged = false) {
  return (ctx: Ctx): Obj => {
    allowOnly(ctx.body, fields)
    const object = ctx.store.require(coll, ctx.params.id!, type)
    return updateObject(ctx, object, `${type}.updated`, o => apply(ctx, o), onlyIfChanged)
  }
}

/** Top-level fields whose value changed, with their old value (Stripe's `previous_attributes`). */
export function previousAttributes(before: Obj, after: Obj): Obj | undefined {
  const prev: Obj = {}
  for (const key of Object.keys(after)) {
    if (JSON.stringify(before[key]) !== JSON.stringify(after[key])) prev[key] = before[key] ?? null
  }
  return Object.keys(prev).length ? prev : undefined
}
