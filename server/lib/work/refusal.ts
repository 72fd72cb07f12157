import { EngineError, type EngineErrorCode } from '../../engine/errors'
import { ImportRefused } from '../import/limits'

// A refusal thrown inside a worker thread loses its class on the way back (structured clone keeps only name, message
// and stack), so the worker sends it as data and the pool throws the same class again on the request's side.
export type Refusal =
  | { type: 'engine', code: EngineErrorCode, message: string, point?: number }
  | { type: 'import', statusCode: ImportRefused['statusCode'], message: string }

export type TaskOutcome<T> = { ok: true, value: T } | { ok: false, refusal: Refusal }

/** The refusal as data, or null when the error is not one the user can act on (a bug: it travels as an Error). */
export function toRefusal(error: unknown): Refusal | null {
  if (error instanceof EngineError) return { type: 'engine', code: error.code, message: error.message, ...(error.point !== undefined ? { point: error.point } : {}) }
  if (error instanceof ImportRefused) return { type: 'import', statusCode: error.statusCode, message: error.message }
  return null
}

export function fromRefusal(refusal: Refusal): Error {
  return refusal.type === 'engine' ? new EngineError(refusal.code, refusal.message, refusal.point) : new ImportRefused(refusal.statusCode, refusal.message)
}
