import Decimal from 'decimal.js'
import fc from 'fast-check'
import { describe, expect, it } from 'vitest'
import { compare, compareAsync } from '~~/server/engine'
import type { FillResult, MethodSpec } from '~~/server/engine/types'

// The pairwise largest difference shortlists points in binary floating point; it must still equal the
// exhaustive decimal answer (value and first place), including near ties far below double precision.
function bruteForce(a: FillResult, b: FillResult): { max: string, at: string | null } {
  const D = Decimal.clone({ precision: 60 })
  let worst = new D(0)
  let at: string | null = null
  a.points.forEach((p, k) => {
    const d = new D(p.y).minus(b.points[k]!.y).abs()
    if (d.gt(worst)) { worst = d; at = p.x }
  })
  return { max: worst.toSignificantDigits(a.spec.precision, Decimal.ROUND_HALF_EVEN).toString(), at }
}

const methods: MethodSpec[] = [{ method: 'linear' }, { method: 'quadratic' }, { method: 'cubic-natural' }, { method: 'pchip' }]

describe('compare: pairwise largest differences', () => {
  it('equal the exhaustive decimal answer on random data (property)', () => {
    fc.assert(fc.property(
      fc.array(fc.double({ min: -1e6, max: 1e6, noNaN: true, noDefaultInfinity: true }), { minLength: 4, maxLength: 9 }),
      fc.integer({ min: 0, max: 30 }),
      (ys, offsetDigits) => {
        // a large common offset makes the differences tiny relative to the values (near ties in floating point)
        const offset = new Decimal(10).pow(offsetDigits)
        const knots = ys.map((y, i) => ({ x: String(i * 2), y: offset.plus(new Decimal(y.toPrecision(12))).toString() }))
        const r = compare({ knots, method: 'linear', grid: { from: '0', to: String((ys.length - 1) * 2), step: '0.25' } }, methods)
        const done = r.entries.filter(e => e.ok)
        let p = 0
        for (let i = 0; i < done.length; i += 1) {
          for (let j = i + 1; j < done.length; j += 1) {
            const want = bruteForce(done[i]!.result, done[j]!.result)
            expect(new Decimal(r.pairs[p]!.maxAbsDifference).eq(want.max), `${r.pairs[p]!.maxAbsDifference} vs ${want.max}`).toBe(true)
            expect(r.pairs[p]!.at).toBe(want.at)
            p += 1
          }
        }
      },
    ), { numRuns: 40 })
  })
})

describe('compareAsync (the server\'s driver: a pause after each method)', () => {
  const knots = [0, 1, 2, 3, 4].map(x => ({ x: String(x), y: String((x * x) / 10 + 1) }))
  const request = { knots, method: 'linear' as const, grid: { from: '0', to: '4', step: '0.25' } }

  it('gives the same result as compare and pauses once per method', async () => {
    let pauses = 0
    const result = await compareAsync(request, methods, {}, async () => { pauses += 1 })
    expect(pauses).toBe(methods.length)
    expect(result).toEqual(compare(request, methods))
  })

  it('stops filling when the pause throws (the person cancelled)', async () => {
    let pauses = 0
    const stop = compareAsync(request, methods, {}, async () => {
      pauses += 1
      if (pauses === 2) throw new Error('cancelled')
    })
    await expect(stop).rejects.toThrow('cancelled')
    expect(pauses).toBe(2)
  })
})
