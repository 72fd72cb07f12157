import Decimal from 'decimal.js'
import fc from 'fast-check'
import { describe, expect, it } from 'vitest'
import { canonicalDecimal, cmpDecimal, parseNumberText, shiftPointLeft, toPerUnit } from '#shared/decimal-text'
import { pointsContentHash } from '~~/server/lib/points-hash'

// The string fast paths are checked against decimal.js (an outside general-purpose library).
const plain = fc.tuple(fc.boolean(), fc.nat({ max: 100000 }), fc.option(fc.stringMatching(/^\d{1,12}$/)))
  .map(([neg, int, frac]) => `${neg ? '-' : ''}${String(int).padStart(Math.min(3, String(int).length + (int % 3)), '0')}${frac !== null ? `.${frac}` : ''}`)
const ref = (v: string) => { const d = new Decimal(v); return d.isZero() ? '0' : d.toFixed() }

describe('decimal text', () => {
  it('canonical text matches decimal.js toFixed (no exponent, no trailing zeros, -0 as 0)', () => {
    fc.assert(fc.property(plain, v => canonicalDecimal(v) === ref(v)), { numRuns: 3000 })
    expect(canonicalDecimal('1e-7')).toBe('0.0000001')
  })
  it('orders exactly like decimal.js', () => {
    fc.assert(fc.property(plain, plain, (a, b) => Math.sign(cmpDecimal(canonicalDecimal(a), canonicalDecimal(b))) === new Decimal(a).cmp(b)), { numRuns: 3000 })
  })
  it('divides by 100 and 1000 exactly by moving the point', () => {
    fc.assert(fc.property(plain, fc.constantFrom(2, 3), (v, k) => shiftPointLeft(canonicalDecimal(v), k) === ref(new Decimal(v).div(10 ** k).toFixed())), { numRuns: 3000 })
  })
  it('reads spreadsheet habits: thousands separators, %, per mille, unicode minus; refuses the rest', () => {
    expect(parseNumberText('1,234.50')).toEqual({ ok: true, value: '1234.5', scale: 1 })
    expect(toPerUnit(parseNumberText('12.5%') as never, 'per-unit')).toBe('0.125')
    expect(toPerUnit(parseNumberText('3 \u2030') as never, 'per-unit')).toBe('0.003')
    expect(toPerUnit(parseNumberText('0.6879') as never, 'percent')).toBe('0.006879')
    expect(parseNumberText('\u22120.5')).toMatchObject({ ok: true, value: '-0.5' })
    expect(parseNumberText('n/a')).toEqual({ ok: false, reason: 'is not a number' })
    expect(parseNumberText('0,5')).toMatchObject({ ok: false, reason: expect.stringContaining('comma') })
    expect(parseNumberText('1'.repeat(41))).toMatchObject({ ok: false })
  })
  it('hashes content, not its spelling or order', () => {
    const a = pointsContentHash([{ x: '65', y: '0.0123' }, { x: '60', y: '0.01' }])
    expect(pointsContentHash([{ x: '60.0', y: '0.010' }, { x: '065', y: '0.01230' }])).toBe(a)
    expect(pointsContentHash([{ x: '60', y: '0.01' }, { x: '65', y: '0.0124' }])).not.toBe(a)
  })
})
