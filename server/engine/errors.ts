/** Why a request was refused; `code` is stable for programs, `message` is written for the user. */
export type EngineErrorCode =
  | 'invalid-request'
  | 'invalid-knot'
  | 'duplicate-x'
  | 'too-few-points'
  | 'unknown-method'
  | 'invalid-option'
  | 'invalid-grid'
  | 'outside-knots'
  | 'transform-domain'
  | 'unequal-spacing'
  | 'invalid-group'
  | 'ill-conditioned'
  | 'not-applicable'
  | 'calibration-failed'

export class EngineError extends Error {
  readonly code: EngineErrorCode
  /** 1-based position of the offending knot in the request, when one point is to blame. */
  readonly point?: number

  constructor(code: EngineErrorCode, message: string, point?: number) {
    super(message)
    this.name = 'EngineError'
    this.code = code
    if (point !== undefined) this.point = point
  }
}
