import { DATABASE_RETRY_AFTER_SECONDS, DATABASE_UNAVAILABLE_MESSAGE, isDatabaseUnavailable } from '~~/server/lib/database-unavailable'

let lastLogged = 0

// Runs before Nuxt's own error handler (nuxt.config.ts, hook nitro:config): a failure because PostgreSQL cannot be
// reached becomes 503 with Retry-After and a message that says so. It only rewrites the error; Nuxt's handler then
// answers as usual: JSON with data.code for the API, the error page (error.vue) for pages.
export default defineNitroErrorHandler((error, event) => {
  if (!isDatabaseUnavailable(error)) return
  if (Date.now() - lastLogged > 10_000) {
    lastLogged = Date.now()
    console.warn(`[db] unavailable, answering 503: ${(error.cause as Error | undefined)?.message ?? error.message}`)
  }
  Object.assign(error, { statusCode: 503, statusMessage: DATABASE_UNAVAILABLE_MESSAGE, message: DATABASE_UNAVAILABLE_MESSAGE, data: { code: 'service-unavailable' }, unhandled: false, fatal: false })
  setResponseHeader(event, 'retry-after', DATABASE_RETRY_AFTER_SECONDS)
  setResponseStatus(event, 503, DATABASE_UNAVAILABLE_MESSAGE)
})
