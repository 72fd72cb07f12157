import { DATABASE_RETRY_AFTER_SECONDS, DATABASE_UNAVAILABLE_MESSAGE } from '~~/server/lib/database-unavailable'

// Pages answer 503 (the error page, with Retry-After) while PostgreSQL cannot be reached, instead of a sign-in page or a
// half-empty screen; API routes get the same answer from the error handler (server/error-handlers/). Only page
// navigations are checked: GET or HEAD asking for HTML, outside /api/ and Nuxt's own paths.
export default defineEventHandler(async (event) => {
  if (event.method !== 'GET' && event.method !== 'HEAD') return
  const path = event.path
  if (path.startsWith('/api/') || path.startsWith('/_nuxt/') || path.startsWith('/__nuxt')) return
  if (!getRequestHeader(event, 'accept')?.includes('text/html')) return
  if (await databaseReachable()) return
  setResponseHeader(event, 'retry-after', DATABASE_RETRY_AFTER_SECONDS)
  throw apiError(503, 'service-unavailable', DATABASE_UNAVAILABLE_MESSAGE)
})
