import type { Ctx } from './context.ts'
import type { Obj } from './store.ts'

export interface Route {
  method: 'GET' | 'POST' | 'DELETE'
  path: string
  handler: (ctx: Ctx) => Obj
}
