import type { Ctx } from './context.ts'
import type { Obj } from './store.ts'

export interface Route {
  method: 'GET' | 'POST' | 'DELETE'
  path: string
  handler: (ctx: Ctx) => Obj
}

export interface ResourceHandlers {
  create?: Route['handler']
  list?: Route['handler']
  retrieve?: Route['handler']
  update?: Route['handler']
  remove?: Route['handler']
}

/** The usual routes of a Stripe collection at `base` (/v1/customers): create, list, retrieve, update, delete; each optional. */
export function resourceRoutes(base: string, h: ResourceHandlers): Route[] {
  const routes: (Route | null)[] = [
    h.create ? { method: 'POST', path: base, handler: h.create } : null,
    h.list ? { method: 'GET', path: base, handler: h.list } : null,
    h.retrieve ? { method: 'GET', path: `${base}/:id`, handler: h.retrieve } : null,
    h.update ? { method: 'POST', path: `${base}/:id`, handler: h.update } : null,
    h.remove ? { method: 'DELETE', path: `${base}/:id`, handler: h.remove } : null,
  ]
  return routes.filter((r): r is Route => r !== null)
}
