import { existsSync, mkdirSync, readFileSync, renameSync, writeFileSync } from 'node:fs'
import { dirname } from 'node:path'
import { missing } from './errors.ts'

// eslint-disable-next-line @typescript-eslint/no-explicit-any -- Stripe objects are open JSON shapes
export type Obj = Record<string, any>

/** Id prefix → collection; `findById` uses it for `expand[]`. */
export const PREFIXES = {
  cus: 'customers', prod: 'products', price: 'prices', pm: 'payment_methods', sub: 'subscriptions',
  in: 'invoices', ii: 'invoiceitems', evt: 'events', we: 'webhook_endpoints',
} as const
export type Collection = (typeof PREFIXES)[keyof typeof PREFIXES]

export interface IdempotencyRecord { fingerprint: string; status: number; body: string; created: number }

export interface State {
  version: 1
  clockOffset: number
  objects: Record<Collection, Record<string, Obj>>
  /** Full card number behind each card payment method (never answered by the API). */
  cardNumbers: Record<string, string>
  endpointSecrets: Record<string, string>
  idempotency: Record<string, IdempotencyRecord>
}

function emptyState(): State {
  const objects = Object.fromEntries(Object.values(PREFIXES).map((c) => [c, {}])) as State['objects']
  return { version: 1, clockOffset: 0, objects, cardNumbers: {}, endpointSecrets: {}, idempotency: {} }
}

const MAX_EVENTS = 5000

export class Store {
  state: State = emptyState()

  constructor(private file?: string) {
    if (file && existsSync(file)) {
      const loaded = JSON.parse(readFileSync(file, 'utf8')) as State
      if (loaded.version === 1) this.state = { ...emptyState(), ...loaded, objects: { ...emptyState().objects, ...loaded.objects } }
    }
  }

  /** Objects newest first (Stripe's list order). Insertion order is kept by the object keys. */
  all(coll: Collection): Obj[] {
    return Object.values(this.state.objects[coll]).reverse()
  }

  get(coll: Collection, id: string): Obj | undefined {
    return this.state.objects[coll][id]
  }

  require(coll: Collection, id: string, kind: string, param?: string): Obj {
    const obj = this.state.objects[coll][id]
    if (!obj || obj.deleted) throw missing(kind, id, param)
    return obj
  }

  insert<T extends Obj>(obj: T): T {
    const coll = collectionOf(obj.id)
    if (!coll) throw new Error(`no collection for ${obj.id}`)
    this.state.objects[coll][obj.id] = obj
    if (coll === 'events') this.trimEvents()
    return obj
  }

  findById(id: string): Obj | undefined {
    const coll = collectionOf(id)
    if (coll) return this.state.objects[coll][id]
    if (id.startsWith('si_')) {
      for (const sub of Object.values(this.state.objects.subscriptions)) {
        const item = sub.items.data.find((i: Obj) => i.id === id)
        if (item) return item
      }
    }
    return undefined
  }

  snapshot(): string {
    return JSON.stringify(this.state)
  }

  restore(snapshot: string): void {
    this.state = JSON.parse(snapshot)
  }

  reset(): void {
    this.state = emptyState()
    this.save()
  }

  /** Atomic write (temp file + rename) when `FAKE_STRIPE_STATE` names a file. */
  save(): void {
    if (!this.file) return
    mkdirSync(dirname(this.file), { recursive: true })
    const tmp = `${this.file}.${process.pid}.tmp`
    writeFileSync(tmp, JSON.stringify(this.state))
    renameSync(tmp, this.file)
  }

  private trimEvents(): void {
    const ids = Object.keys(this.state.objects.events)
    for (const id of ids.slice(0, Math.max(0, ids.length - MAX_EVENTS))) delete this.state.objects.events[id]
  }
}

export function collectionOf(id: string): Collection | undefined {
  const prefix = id.slice(0, id.indexOf('_')) as keyof typeof PREFIXES
  return PREFIXES[prefix]
}

export function clone<T>(v: T): T {
  return structuredClone(v)
}
