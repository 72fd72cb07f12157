import type { ApiErrorCode } from '#shared/api-errors'

interface FetchFailure {
  status?: number
  statusMessage?: string
  data?: { statusMessage?: string, message?: string, data?: { code?: string, issues?: { message: string }[] } }
}

/** The machine-readable code of a failed request (data.code, shared/api-errors.ts), or null. Decide on this, never on text. */
export function apiErrorCode(error: unknown): ApiErrorCode | null {
  return ((error as FetchFailure)?.data?.data?.code as ApiErrorCode | undefined) ?? null
}

/** The message a person can act on: the first validation problem, else the server's message, else the fallback. */
export function apiErrorMessage(error: unknown, fallback = 'Something went wrong. Try again.'): string {
  const e = error as FetchFailure
  return e?.data?.data?.issues?.[0]?.message ?? e?.data?.statusMessage ?? e?.data?.message ?? e?.statusMessage ?? fallback
}
