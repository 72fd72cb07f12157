import Decimal from 'decimal.js'
import { MAX_INPUT_DIGITS, TEXT_DIGITS } from './engine/contract'
import type { ValueUnit } from './tables'

// Decimal arithmetic for table values, at TEXT_DIGITS (2 x the engine's most digits; the reason is beside the constant in
// shared/engine/contract.ts): scaling by 100 or 1000 is exact for any stored or filled value, and so is the difference of
// two stored values.
export const D = Decimal.clone({ precision: TEXT_DIGITS, rounding: Decimal.ROUND_HALF_EVEN })
export const MAX_SIGNIFICANT_DIGITS = MAX_INPUT_DIGITS

export const UNIT_SCALE: Record<ValueUnit, number> = { 'per-unit': 1, 'percent': 100, 'per-mille': 1000, 'basis-points': 10000 }
const SHIFT: Record<number, number> = { 1: 0, 100: 2, 1000: 3, 10000: 4 }

/**
 * Canonical decimal text: plain notation (no exponent), no trailing zeros after the point,
 * no leading '+', '-0' written '0' (decimal.js toFixed() on a normalised value).
 */
export function canonicalDecimal(value: Decimal.Value): string {
  if (typeof value === 'string') {
    const fast = canonicalPlain(value)
    if (fast !== null) return fast
  }
  const d = new D(value)
  return d.isZero() ? '0' : d.toFixed()
}

const SIMPLE = /^([+-]?)(\d+)(?:\.(\d*))?$/

/** Canonical text of a plain decimal ('-007.500' -> '-7.5') by string work alone; null for other forms. */
function canonicalPlain(text: string): string | null {
  const m = SIMPLE.exec(text)
  if (!m) return null
  const int = m[2]!.replace(/^0+(?=\d)/, '')
  const frac = (m[3] ?? '').replace(/0+$/, '')
  const body = frac ? `${int}.${frac}` : int
  return m[1] === '-' && body !== '0' ? `-${body}` : body
}

/** Exact order of two canonical decimal texts (no floats). */
export function cmpDecimal(a: string, b: string): number {
  const na = a.startsWith('-')
  const nb = b.startsWith('-')
  if (na !== nb) return na ? -1 : 1
  const [ai, af = ''] = (na ? a.slice(1) : a).split('.') as [string, string?]
  const [bi, bf = ''] = (nb ? b.slice(1) : b).split('.') as [string, string?]
  const r = ai.length !== bi.length ? (ai.length < bi.length ? -1 : 1) : ai !== bi ? (ai < bi ? -1 : 1) : af === bf ? 0 : af < bf ? -1 : 1
  return na ? -r : r
}

/** Canonical decimal text divided by 10^k: moving the point is exact. */
export function shiftPointLeft(canonical: string, k: number): string {
  if (k === 0 || canonical === '0') return canonical
  const neg = canonical.startsWith('-')
  const [int, frac = ''] = (neg ? canonical.slice(1) : canonical).split('.') as [string, string?]
  const digits = int + frac
  const point = int.length - k
  const moved = point <= 0 ? `0.${'0'.repeat(-point)}${digits}` : `${digits.slice(0, point)}.${digits.slice(point)}`
  return canonicalPlain(`${neg ? '-' : ''}${moved}`)!
}

export type ParsedNumber = { ok: true; value: string; scale: 1 | 100 | 1000 | 10000 } | { ok: false; reason: string }

const PLAIN = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d{1,4})?$/
const THOUSANDS = /^[+-]?\d{1,3}(,\d{3})+(\.\d*)?$/

/**
 * Reads a number as people type it in a spreadsheet: '1,234.5', '1.2%', '0.8 ‰', '−0.5'.
 * A '%', '‰' or 'bp' in the cell sets its own scale; otherwise the column's unit applies.
 */
export function parseNumberText(raw: string): ParsedNumber {
  let text = raw.replace(/[\u00a0\u2009\u202f]/g, ' ').trim().replace(/^\u2212/, '-')
  if (!text) return { ok: false, reason: 'is blank' }
  let scale: 1 | 100 | 1000 | 10000 = 1
  if (text.endsWith('%')) { scale = 100; text = text.slice(0, -1).trim() } else if (text.endsWith('\u2030')) { scale = 1000; text = text.slice(0, -1).trim() } else if (/\s?bps?$/i.test(text)) { scale = 10000; text = text.replace(/\s?bps?$/i, '').trim() }
  if (/^[+-]?\d{1,3}( \d{3})+(\.\d*)?$/.test(text)) text = text.replace(/ /g, '')
  if (THOUSANDS.test(text)) text = text.replace(/,/g, '')
  if (!PLAIN.test(text)) {
    return { ok: false, reason: /^[+-]?\d+,\d+$/.test(text) ? 'uses a comma as decimal mark; write decimals with a point' : 'is not a number' }
  }
  const plain = canonicalPlain(text)
  if (plain !== null) {
    const [int, frac = ''] = plain.replace('-', '').split('.') as [string, string?]
    const digits = int === '0' ? frac.replace(/^0+/, '').length : int.length + frac.length
    if (digits > MAX_SIGNIFICANT_DIGITS) return { ok: false, reason: `has more than ${MAX_SIGNIFICANT_DIGITS} significant digits` }
    return { ok: true, value: plain, scale }
  }
  const d = new D(text)
  if (d.sd(true) > MAX_SIGNIFICANT_DIGITS) return { ok: false, reason: `has more than ${MAX_SIGNIFICANT_DIGITS} significant digits` }
  return { ok: true, value: canonicalDecimal(d), scale }
}

/** The stored per-unit value of a parsed cell in a column of the given unit. */
export function toPerUnit(parsed: { value: string; scale: number }, columnUnit: ValueUnit): string {
  const divisor = parsed.scale !== 1 ? parsed.scale : UNIT_SCALE[columnUnit]
  return shiftPointLeft(canonicalDecimal(parsed.value), SHIFT[divisor] ?? 0)
}

/** A stored per-unit value shown in the table's unit (exact). */
export function fromPerUnit(value: string, unit: ValueUnit): string {
  return canonicalDecimal(new D(value).mul(UNIT_SCALE[unit]))
}
