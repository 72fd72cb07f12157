import { bodyRuleFor, formatBytes, isJsonContentType } from '~~/server/lib/request-body-rules'

// Every request body is counted as its bytes arrive and refused with 413 past its route's limit before more of it is
// kept (server/lib/request-body-rules.ts); JSON routes take only application/json (415). The body read here is what
// the handler's readBody / readRawBody then sees. Upload routes read their own multipart bodies (busboy, own caps).
export default defineEventHandler(async (event) => {
  if (!announcesBody(event)) return
  const req = event.node.req as typeof event.node.req & { body?: unknown }
  if (req.body !== undefined || event._requestBody !== undefined) return // an in-process fetch: the body is in memory already
  const rule = bodyRuleFor(event.method, event.path)
  if (rule.json && !isJsonContentType(req.headers['content-type'])) {
    stopReadingBody(event)
    throw apiError(415, 'unsupported-media-type', 'This address takes JSON: send the body as application/json.')
  }
  if (rule.limit === null) return
  const limit = rule.limit
  const body = await readBodyCapped(event, limit, () =>
    apiError(413, 'body-too-large', `The request body is larger than ${formatBytes(limit)}, the limit for this address; Knotwork stopped reading it.`))
  event._requestBody = body as unknown as BodyInit // h3's readRawBody hands a Buffer on as it is (its type says BodyInit)
})
