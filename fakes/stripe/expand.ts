import { invalid } from './errors.ts'
import type { Obj, Store } from './store.ts'
import { clone } from './store.ts'

/** Applies `expand[]` paths (`customer`, `latest_invoice`, `data.customer`, `items.data.price.product`, ...) to a copy. */
export function expandObject(obj: Obj, paths: string[], store: Store): Obj {
  const out = clone(obj)
  for (const path of paths) {
    const segs = path.split('.')
    if (segs.length > 6) throw invalid(`You cannot expand more than 4 levels of a property (${path}).`, 'expand')
    walk(out, segs, store, path)
  }
  return out
}

function resolve(value: unknown, store: Store, path: string): unknown {
  if (value === null || typeof value === 'object') return value
  const found = typeof value === 'string' ? store.findById(value) : undefined
  if (!found) throw invalid(`This property cannot be expanded (${path}).`, 'expand')
  return clone(found)
}

function walk(node: Obj, segs: string[], store: Store, path: string): void {
  const [head, ...rest] = segs
  if (!head || node === null || typeof node !== 'object') return
  if (!(head in node)) throw invalid(`This property cannot be expanded (${path}).`, 'expand')
  const value = node[head]
  if (Array.isArray(value)) {
    node[head] = value.map((v) => {
      const r = resolve(v, store, path) as Obj
      if (rest.length) walk(r, rest, store, path)
      return r
    })
    return
  }
  const r = resolve(value, store, path) as Obj
  node[head] = r
  if (rest.length && r) walk(r, rest, store, path)
}
