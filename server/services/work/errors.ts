import { EngineError } from '../../engine/errors'
import { ImportRefused } from '../../lib/import/limits'
import type { ApiErrorCode } from '#shared/api-errors'
import type { RunError } from './runs'

/** What a failed run tells whoever follows it: the status, code and message its request would have answered. */
export function runErrorOf(error: unknown): RunError {
  if (error instanceof EngineError) return { status: 400, code: 'engine-refused', message: error.message, extra: { engineCode: error.code, point: error.point } }
  if (error instanceof ImportRefused) return { status: error.statusCode, code: 'import-refused', message: error.message }
  const h = error as { statusCode?: number, statusMessage?: string, data?: { code?: ApiErrorCode } & Record<string, unknown> }
  if (h?.statusCode && h.data?.code) {
    const { code, ...extra } = h.data
    return { status: h.statusCode, code, message: h.statusMessage ?? '', extra }
  }
  console.error('[runs] a run failed:', error)
  return { status: 500, code: 'try-later', message: 'The run failed on the server; try again.' }
}

/** The refusal a request answers for a failed run. */
export function throwRunError(error: RunError | null): never {
  const e = error ?? { status: 500, code: 'try-later' as const, message: 'The run failed on the server; try again.' }
  throw apiError(e.status, e.code, e.message, e.extra ?? {})
}
