import { EngineError } from '../engine/index'

/** An engine refusal (bad knots, an option out of range) as the 400 a person reads; anything else is thrown on. */
export function engineFailure(error: unknown): never {
  if (error instanceof EngineError) throw apiError(400, 'engine-refused', error.message, { engineCode: error.code, point: error.point })
  throw error
}
