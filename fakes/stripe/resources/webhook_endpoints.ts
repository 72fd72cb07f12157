import type { Ctx } from '../context.ts'
import { invalid } from '../errors.ts'
import { newId, randomToken } from '../ids.ts'
import { listResponse } from '../list.ts'
import { allowOnly, applyMetadata, listParam, optBool, optNullableString, optString, reqString } from '../params.ts'
import { resourceRoutes, type Route } from '../route.ts'
import type { Obj } from '../store.ts'

function validUrl(url: string): string {
  try {
    const u = new URL(url)
    if (u.protocol === 'http:' || u.protocol === 'https:') return url
  } catch { /* answered below */ }
  throw invalid('Invalid URL: must be an http(s) URL.', 'url', 'url_invalid')
}

function events(v: unknown): string[] {
  const list = listParam(v, 'enabled_events').map(String)
  if (!list.length) throw invalid('Missing required param: enabled_events.', 'enabled_events', 'parameter_missing')
  return list
}

function create(ctx: Ctx): Obj {
  allowOnly(ctx.body, ['url', 'enabled_events', 'description', 'metadata', 'api_version'])
  const secret = `whsec_${randomToken(32)}`
  const we = ctx.store.insert({
    id: newId('we'), object: 'webhook_endpoint', api_version: optString(ctx.body, 'api_version') ?? ctx.apiVersion,
    application: null, created: ctx.now(), description: optNullableString(ctx.body, 'description') ?? null,
    enabled_events: events(ctx.body.enabled_events), livemode: false, metadata: applyMetadata({}, ctx.body.metadata),
    status: 'enabled', url: validUrl(reqString(ctx.body, 'url')),
  })
  ctx.store.state.endpointSecrets[we.id] = secret
  return { ...we, secret }
}

function update(ctx: Ctx): Obj {
  allowOnly(ctx.body, ['url', 'enabled_events', 'description', 'metadata', 'disabled'])
  const we = ctx.store.require('webhook_endpoints', ctx.params.id!, 'webhook endpoint')
  const url = optString(ctx.body, 'url')
  if (url !== undefined) we.url = validUrl(url)
  if (ctx.body.enabled_events !== undefined) we.enabled_events = events(ctx.body.enabled_events)
  const d = optNullableString(ctx.body, 'description')
  if (d !== undefined) we.description = d
  const disabled = optBool(ctx.body, 'disabled')
  if (disabled !== undefined) we.status = disabled ? 'disabled' : 'enabled'
  we.metadata = applyMetadata(we.metadata, ctx.body.metadata)
  return we
}

function remove(ctx: Ctx): Obj {
  const we = ctx.store.require('webhook_endpoints', ctx.params.id!, 'webhook endpoint')
  delete ctx.store.state.objects.webhook_endpoints[we.id]
  delete ctx.store.state.endpointSecrets[we.id]
  return { id: we.id, object: 'webhook_endpoint', deleted: true }
}

export const routes: Route[] = [
  ...resourceRoutes('/v1/webhook_endpoints', { create, list: (ctx) => listResponse(ctx.store.all('webhook_endpoints'), ctx.body, '/v1/webhook_endpoints'), retrieve: (ctx) => ctx.store.require('webhook_endpoints', ctx.params.id!, 'webhook endpoint'), update, remove }),
]
