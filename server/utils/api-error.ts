import type { ApiErrorCode } from '#shared/api-errors'

/**
 * The one way the server refuses a request: an HTTP status, a machine-readable code (shared/api-errors.ts) the client
 * decides on, and a message a person can act on. Extra fields (issues, lockVersion, findings) go into `data` beside the code.
 */
export function apiError(statusCode: number, code: ApiErrorCode, message: string, extra: Record<string, unknown> = {}) {
  return createError({ statusCode, statusMessage: message, data: { ...extra, code } })
}

/**
 * The JSON body of a refusal (the shape h3 sends for apiError), for the few answers that must be JSON whatever the
 * client accepts: an unknown /api/ address asked for by a browser would otherwise get the app's HTML error page.
 */
export function apiErrorBody(statusCode: number, code: ApiErrorCode, message: string) {
  return { error: true, statusCode, statusMessage: message, message, data: { code } }
}
