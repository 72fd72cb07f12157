import type { Ctx } from '../context.ts'
import { createdFilter, listResponse } from '../list.ts'
import { allowOnly, listParam, optString } from '../params.ts'
import { resourceRoutes, type Route } from '../route.ts'
import type { Obj } from '../store.ts'

/** `type` may end in `*` (`invoice.*`), as in Stripe. */
export function typeMatches(pattern: string, type: string): boolean {
  return pattern === '*' || pattern === type || (pattern.endsWith('.*') && type.startsWith(pattern.slice(0, -1)))
}

function list(ctx: Ctx): Obj {
  allowOnly(ctx.body, ['type', 'types', 'created', 'limit', 'starting_after', 'ending_before', 'delivery_success'])
  const type = optString(ctx.body, 'type')
  const types = ctx.body.types === undefined ? undefined : listParam(ctx.body.types, 'types').map(String)
  const created = createdFilter(ctx.body)
  const items = ctx.store.all('events').filter((e) => created(e) && (!type || typeMatches(type, e.type)) && (!types || types.includes(e.type)))
  return listResponse(items, ctx.body, '/v1/events')
}

export const routes: Route[] = [
  ...resourceRoutes('/v1/events', { list, retrieve: (ctx) => ctx.store.require('events', ctx.params.id!, 'event') }),
]
