import { missing } from '../errors.ts'
import { listResponse } from '../list.ts'
import { allowOnly, reqString } from '../params.ts'
import type { Route } from '../route.ts'
import type { Obj } from '../store.ts'
import { updateSubscriptionItem } from '../billing/subscription_update.ts'

export const routes: Route[] = [
  { method: 'GET', path: '/v1/subscription_items', handler: (ctx) => {
    allowOnly(ctx.body, ['subscription', 'limit', 'starting_after', 'ending_before'])
    const id = reqString(ctx.body, 'subscription')
    const sub = ctx.store.require('subscriptions', id, 'subscription', 'subscription')
    return listResponse([...sub.items.data].reverse(), ctx.body, `/v1/subscription_items?subscription=${id}`)
  } },
  { method: 'GET', path: '/v1/subscription_items/:id', handler: (ctx) => {
    const found = ctx.store.findById(ctx.params.id!)
    if (!found || found.object !== 'subscription_item') throw missing('subscription item', ctx.params.id!)
    return found as Obj
  } },
  { method: 'POST', path: '/v1/subscription_items/:id', handler: updateSubscriptionItem },
]
