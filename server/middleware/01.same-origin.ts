// Cross-site request forgery: every request that may change something (any method but GET, HEAD and OPTIONS) must
// come from one of the app's own pages (server/utils/origin.ts), and a body on a JSON route must not be of a type a
// cross-site form or a no-cors fetch can send without asking (form-urlencoded, multipart, text/plain, or no type).
// Refused with 403 before any handler, session or body is read, so a refusal never touches the session cookie.
// Named 01.* so it runs before the other middleware (Nitro runs them in file-name order): a forged form is refused
// here, whatever its size or type.

const SAFE_METHODS = new Set(['GET', 'HEAD', 'OPTIONS'])
/** Routes that prove who is calling another way: Stripe's signature, the read API's bearer token (plain segments only). */
const EXEMPT = [/^\/api\/webhooks\/stripe$/, /^\/api\/v1(\/[\w-]+)+$/]
/** Routes that take a multipart upload (readUpload) instead of JSON: the origin is still checked. */
const MULTIPART = [/^\/api\/orgs\/[\w-]+\/imports$/, /^\/api\/orgs\/[\w-]+\/exports\/verify$/]
const FORM_TYPES = new Set(['', 'application/x-www-form-urlencoded', 'multipart/form-data', 'text/plain'])

function hasBody(event: Parameters<typeof getRequestHeader>[0]): boolean {
  return Number(getRequestHeader(event, 'content-length') || 0) > 0 || getRequestHeader(event, 'transfer-encoding') !== undefined
}

export default defineEventHandler((event) => {
  if (SAFE_METHODS.has(event.method)) return
  const path = event.path.split('?')[0]!
  if (EXEMPT.some(rule => rule.test(path))) return
  if (!provesSameOrigin(event)) {
    throw apiError(403, 'cross-origin', 'Refused: this change did not come from a Knotwork page (the browser named another site, or none). Open Knotwork at its own address and try again.')
  }
  const type = (getRequestHeader(event, 'content-type') ?? '').split(';')[0]!.trim().toLowerCase()
  if (hasBody(event) && FORM_TYPES.has(type) && !MULTIPART.some(rule => rule.test(path))) {
    throw apiError(403, 'json-required', 'Refused: this address takes JSON (Content-Type: application/json), not a form post.')
  }
})
