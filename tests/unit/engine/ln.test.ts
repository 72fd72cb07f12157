// The engine's ln (Newton's method on the fast exp, server/engine/ln.ts) against decimal.js's correctly rounded ln at 300
// digits (source: decimal.js, and the definition ln(e^y) = y). Faithful: within one unit in the last place.
import Decimal from 'decimal.js'
import fc from 'fast-check'
import { describe, expect, it } from 'vitest'
import { decimalContext } from '~~/server/engine/decimal'
import { ln } from '~~/server/engine/ln'

const R = Decimal.clone({ precision: 300 })

describe('ln by Newton on the fast exp', () => {
  it('is within one unit in the last place of decimal.js at 300 digits, for precisions 16 to 210, near 1 as well', () => {
    fc.assert(fc.property(fc.integer({ min: 16, max: 210 }), fc.bigInt({ min: 1n, max: 10n ** 40n }), fc.integer({ min: -45, max: 5 }), fc.boolean(), (digits, mantissa, exponent, nearOne) => {
      const D = decimalContext(digits)
      const raw = new D(`${mantissa.toString()}e${exponent}`)
      const x = nearOne ? new D(1).plus(raw.times('1e-30')) : raw
      if (x.lte(0) || x.eq(1)) return
      const ours = ln(x)
      const exact = new R(x).ln()
      const ulp = new R(10).pow(exact.e - digits + 1)
      expect(ours.minus(exact).abs().lte(ulp), `${x.toString()} at ${digits}`).toBe(true)
    }), { numRuns: 80 })
  })
  it('gives 0 at 1 and the same digits every time', () => {
    const D = decimalContext(50)
    expect(ln(new D(1)).isZero()).toBe(true)
    const x = new D('0.03456789')
    expect(ln(x).toString()).toBe(ln(x).toString())
  })
})
