import type { Params } from './form.ts'
import { invalid } from './errors.ts'
import { optInt, optString } from './params.ts'
import type { Obj } from './store.ts'

/** Cursor pagination as Stripe does it: newest first, `limit` 1..100 (default 10), `starting_after` / `ending_before`. */
export function listResponse(items: Obj[], p: Params, url: string): Obj {
  const limit = optInt(p, 'limit', 'limit', 1) ?? 10
  if (limit > 100) throw invalid('Invalid limit: must be between 1 and 100', 'limit')
  const after = optString(p, 'starting_after')
  const before = optString(p, 'ending_before')
  let data = items
  if (after) {
    const i = items.findIndex((o) => o.id === after)
    if (i < 0) throw invalid(`No such object: '${after}'`, 'starting_after', 'resource_missing')
    data = items.slice(i + 1)
  } else if (before) {
    const i = items.findIndex((o) => o.id === before)
    if (i < 0) throw invalid(`No such object: '${before}'`, 'ending_before', 'resource_missing')
    data = items.slice(Math.max(0, i - limit), i)
    return { object: 'list', data, has_more: i - limit > 0, url }
  }
  return { object: 'list', data: data.slice(0, limit), has_more: data.length > limit, url }
}

/** `created[gte]=...` style range filter, or `created=<exact>`. */
export function createdFilter(p: Params): (o: Obj) => boolean {
  const c = p.created
  if (c === undefined) return () => true
  if (typeof c === 'string') return (o) => o.created === Number(c)
  const bound = (k: string) => (c[k] === undefined ? undefined : Number(c[k]))
  const [gt, gte, lt, lte] = [bound('gt'), bound('gte'), bound('lt'), bound('lte')]
  return (o) => (gt === undefined || o.created > gt) && (gte === undefined || o.created >= gte)
    && (lt === undefined || o.created < lt) && (lte === undefined || o.created <= lte)
}
