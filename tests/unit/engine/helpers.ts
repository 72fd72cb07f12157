import Decimal from 'decimal.js'
import { EngineError, fill, type FillRequest } from '~~/server/engine'

/** A 60-digit context for checks in tests (never the global configuration). */
export const T = Decimal.clone({ precision: 60, rounding: Decimal.ROUND_HALF_EVEN })

/** |a - b| <= max(rel |b|, abs) */
export function close(a: string, b: string, rel: string, abs: string): boolean {
  const d = new T(a).minus(new T(b)).abs()
  return d.lte(Decimal.max(new T(b).abs().times(rel), new T(abs)))
}

export function knots(xs: (string | number)[], ys: (string | number)[]): { x: string, y: string }[] {
  return xs.map((x, i) => ({ x: String(x), y: String(ys[i]) }))
}

/** The EngineError a fill of this request (or this call) throws; fails the test if it throws nothing or something else. */
export function engineErrorOf(request: FillRequest | (() => unknown)): EngineError {
  try {
    if (typeof request === 'function') request()
    else fill(request)
  }
  catch (e) {
    if (e instanceof EngineError) return e
    throw e
  }
  throw new Error('no error raised')
}
