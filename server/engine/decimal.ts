import Decimal from 'decimal.js'
import { expSmall } from './exact'

export type Dec = Decimal
export type DecimalCtor = Decimal.Constructor

const contexts = new Map<number, DecimalCtor>()

/**
 * A Decimal constructor working at `digits` significant digits with half-even rounding.
 * One clone per precision, cached; the global Decimal configuration is never touched. Which digits: precision.ts.
 */
export function decimalContext(digits: number): DecimalCtor {
  let ctor = contexts.get(digits)
  if (!ctor) {
    ctor = Decimal.clone({
      precision: digits,
      rounding: Decimal.ROUND_HALF_EVEN,
      toExpNeg: -60,
      toExpPos: 60,
      maxE: 9e15,
      minE: -9e15,
    })
    contexts.set(digits, ctor)
  }
  return ctor
}

/** Plain decimal notation: optional sign, digits with optional point, optional exponent. No hex, no Infinity, no NaN. */
const DECIMAL_TEXT = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/

export type ParseFailure = 'not-a-string' | 'not-a-number' | 'not-finite'
export type ParseOutcome = { ok: true, value: Dec } | { ok: false, reason: ParseFailure }

/** Parse a decimal string strictly. JS numbers are refused: table values travel as strings end to end. */
export function parseDecimal(D: DecimalCtor, raw: unknown): ParseOutcome {
  if (typeof raw !== 'string') return { ok: false, reason: 'not-a-string' }
  const text = raw.trim()
  if (/^[+-]?(inf|infinity|nan)$/i.test(text)) return { ok: false, reason: 'not-finite' }
  if (!DECIMAL_TEXT.test(text)) return { ok: false, reason: 'not-a-number' }
  const value = new D(text)
  if (!value.isFinite()) return { ok: false, reason: 'not-finite' }
  return { ok: true, value }
}

/** Round to `digits` significant digits, half-even. */
export function roundTo(value: Dec, digits: number): Dec {
  return value.toSignificantDigits(digits, Decimal.ROUND_HALF_EVEN)
}

/** -1, 0 or 1, as numpy.sign. */
export function sign(value: Dec): -1 | 0 | 1 {
  if (value.isZero()) return 0
  return value.isNegative() ? -1 : 1
}

export function describeFailure(reason: ParseFailure): string {
  if (reason === 'not-a-string') return 'must be given as a decimal string'
  if (reason === 'not-finite') return 'is not finite'
  return 'is not a number'
}

/** Quote a user value for a message, shortened if long. */
export function quote(raw: unknown): string {
  const text = typeof raw === 'string' ? raw : String(raw)
  return `'${text.length > 40 ? `${text.slice(0, 37)}...` : text}'`
}

const expCache = new Map<DecimalCtor, Map<number, Dec>>()
const EXP_CACHE_LIMIT = 4096

/**
 * e^v computed as e^n * e^(v - n), n the nearest integer to v (e^(a+b) = e^a e^b): e^n is cached per context, the small
 * remainder goes to expSmall (exact.ts, scaled integers, about ten times faster than decimal.js's exp). Deterministic: the
 * same v gives the same digits whatever the cache holds. Beyond |v| > 10,000 decimal.js's exp is used as it is.
 */
export function exp(v: Dec): Dec {
  const ctor = v.constructor as DecimalCtor
  const n = v.toDecimalPlaces(0, Decimal.ROUND_HALF_EVEN)
  if (n.abs().gt(10000)) return v.exp()
  if (n.isZero()) return expSmall(v, ctor.precision, ctor)
  let cache = expCache.get(ctor)
  if (!cache) expCache.set(ctor, cache = new Map())
  const key = n.toNumber()
  let en = cache.get(key)
  if (!en) {
    en = n.exp()
    if (cache.size < EXP_CACHE_LIMIT) cache.set(key, en)
  }
  return expSmall(v.minus(n), ctor.precision, ctor).times(en)
}
