// Property tests (fast-check). Sources of the properties: interpolation passes through its data (definition);
// linear interpolation and PCHIP preserve monotonicity and stay within the data's range (Fritsch and Carlson 1980,
// Fritsch and Butland 1984); the fit depends on the set of points, not their order (definition).
import fc from 'fast-check'
import Decimal from 'decimal.js'
import { describe, expect, it } from 'vitest'
import { fill, type MethodId } from '~~/server/engine'

const ALL: MethodId[] = ['linear', 'log-linear', 'quadratic', 'cubic-natural', 'cubic-clamped', 'cubic-not-a-knot', 'pchip', 'akima']
const H = Decimal.clone({ precision: 60 })

/** 2..12 points with distinct x (hundredths, 0..200) and y in thousandths (positive, for log-linear). */
const dataset = fc.uniqueArray(fc.integer({ min: 0, max: 20000 }), { minLength: 2, maxLength: 12 }).chain(xs =>
  fc.tuple(fc.constant(xs), fc.array(fc.integer({ min: 1, max: 999999 }), { minLength: xs.length, maxLength: xs.length })))

function toKnots([xs, ys]: [number[], number[]]): { x: string, y: string }[] {
  return xs.map((x, i) => ({ x: new H(x).div(100).toString(), y: new H(ys[i]!).div(1000).toString() }))
}

function sortedXs(kn: { x: string }[]): string[] {
  return kn.map(k => k.x).sort((a, b) => new H(a).cmp(new H(b)))
}

describe('properties (fast-check)', () => {
  for (const method of ALL) {
    it(`${method} reproduces its knots exactly`, () => {
      fc.assert(fc.property(dataset, (data) => {
        const kn = toKnots(data)
        const r = fill({ knots: kn, method, at: kn.map(k => k.x), precision: 30 })
        r.points.forEach((p, i) => expect(p.y).toBe(new H(kn[i]!.y).toString()))
        expect(r.diagnostics.knotsReproduced).toBe(true)
      }), { numRuns: 60 })
    })
  }

  for (const method of ['linear', 'pchip'] as MethodId[]) {
    it(`${method} keeps monotone data monotone and within the data range`, () => {
      fc.assert(fc.property(dataset, fc.boolean(), (data, increasing) => {
        const ys = [...data[1]].sort((a, b) => (increasing ? a - b : b - a))
        const xs = [...data[0]].sort((a, b) => a - b)
        const kn = toKnots([xs, ys])
        const r = fill({ knots: kn, method, grid: { from: kn[0]!.x, to: kn.at(-1)!.x, step: '0.05' }, precision: 30 })
        const lo = Decimal.min(...kn.map(k => new H(k.y)))
        const hi = Decimal.max(...kn.map(k => new H(k.y)))
        let prev: Decimal | null = null
        for (const p of r.points) {
          const y = new H(p.y)
          expect(y.gte(lo) && y.lte(hi), `${p.x}: ${p.y} outside [${lo}, ${hi}]`).toBe(true)
          if (prev) expect(increasing ? y.gte(prev) : y.lte(prev), `not monotone at ${p.x}`).toBe(true)
          prev = y
        }
        expect(r.diagnostics.monotonicity.fillTurningPoints).toBe(0)
      }), { numRuns: 40 })
    })
  }

  for (const method of ALL) {
    it(`${method} does not depend on the order of the knots`, () => {
      fc.assert(fc.property(dataset, fc.integer(), (data, seed) => {
        const kn = toKnots(data)
        const shuffled = [...kn].sort((a, b) => ((Number(new H(a.x).times(7919).plus(seed).mod(101)) - Number(new H(b.x).times(7919).plus(seed).mod(101)))))
        const xs = sortedXs(kn)
        const at = [xs[0]!, new H(xs[0]!).plus(xs.at(-1)!).div(2).toString(), xs.at(-1)!]
        const a = fill({ knots: kn, method, at, precision: 30 })
        const b = fill({ knots: shuffled, method, at, precision: 30 })
        expect(b.points).toEqual(a.points)
      }), { numRuns: 40 })
    })
  }
})
