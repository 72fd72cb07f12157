// Osculatory and six-term interpolation (karup-king, sprague, beers). Outside references, named beside each check:
// - tests/reference/osculatory_reference.py (run now when python3 with SymPy is on PATH, else its committed output
//   osculatory-fixture.json): Karup-King from its classical Everett form, Sprague derived from its defining conditions
//   with SymPy, Beers' published coefficients checked against the defining conditions, our own minimisation of fifth
//   differences for Beers, and the published group multipliers (Siegel and Swanson, The Methods and Materials of
//   Demography, 2nd ed., 2004, Appendix C; transcribed, not checked against the printed page).
// - Polynomial reproduction (definition of each formula) as fast-check properties.
import Decimal from 'decimal.js'
import fc from 'fast-check'
import { describe, expect, it } from 'vitest'
import { EngineError, fill, type MethodId } from '~~/server/engine'
import { fitRequest } from '~~/server/engine/pipeline'
import { hornerDerivative } from '~~/server/engine/piecewise'
import { loadReference } from './reference'

interface Fixture {
  methods: Record<string, { panels: { offsets: number[], fifths: string[][] }[], reproduces: number }>
  publishedSplit: Record<'sprague' | 'beers', (string | null)[][][]>
  beersMinimised: Record<string, string>
}
const ref = loadReference<Fixture>('osculatory_reference.py', 'osculatory-fixture.json', 'Osculatory reference')

const H = Decimal.clone({ precision: 120 })
const METHODS: MethodId[] = ['karup-king', 'sprague', 'beers']
const PIVOTS = 13
const STEP = 5
const frac = (f: string) => { const [n, d = '1'] = f.split('/'); return new H(n!).div(d) }

/** The value at x of the fill of a unit vector at pivot j (so: the weight of pivot j at x). */
function weights(method: MethodId, at: string[]): string[][] {
  return Array.from({ length: PIVOTS }, (_, j) => fill({
    knots: Array.from({ length: PIVOTS }, (_, i) => ({ x: String(i * STEP), y: i === j ? '1' : '0' })),
    method, at, precision: 40,
  }).points.map(p => p.y))
}

describe('coefficients at fifths equal the reference derivation exactly', () => {
  for (const method of METHODS) {
    it(`${method}: first panels, interior, and the mirrored last panels`, () => {
      const panels = ref.methods[method]!.panels
      const interiorAt = 6 // an interval far from both ends
      const intervals = [...panels.slice(0, -1).map((_, p) => p), interiorAt]
      const at = intervals.flatMap(i => [1, 2, 3, 4].map(m => String(i * STEP + m)))
      const lastAt = panels.slice(0, -1).flatMap((_, p) => [1, 2, 3, 4].map(m => String((PIVOTS - 1 - p) * STEP - m)))
      const w = weights(method, [...at, ...lastAt])
      intervals.forEach((interval, p) => {
        const panel = panels[p]!
        panel.fifths.forEach((row, m) => {
          const k = p * 4 + m
          for (let j = 0; j < PIVOTS; j += 1) {
            const o = panel.offsets.indexOf(j - interval)
            const expected = o < 0 ? new H(0) : frac(row[o]!)
            expect(new H(w[j]![k]!).eq(expected), `${method} interval ${interval} s=${m + 1}/5 pivot ${j}: ${w[j]![k]} vs ${expected}`).toBe(true)
          }
        })
      })
      // last intervals: the mirror image (pivot j <-> PIVOTS - 1 - j, s <-> 1 - s)
      panels.slice(0, -1).forEach((_, p) => [1, 2, 3, 4].forEach((m) => {
        const k = at.length + p * 4 + m - 1
        const first = p * 4 + m - 1
        for (let j = 0; j < PIVOTS; j += 1) expect(w[PIVOTS - 1 - j]![k]).toBe(w[j]![first])
      }))
    })
  }

  it('sprague and beers: the single-year multipliers for group totals equal the published table (Siegel and Swanson 2004, App. C)', () => {
    for (const method of ['sprague', 'beers'] as const) {
      // cumulative pivots Y_0..Y_12 of unit group g: fill the cumulative at every year, then difference
      const at = Array.from({ length: (PIVOTS - 1) * STEP + 1 }, (_, k) => String(k))
      const perGroup = Array.from({ length: PIVOTS - 1 }, (_, g) => {
        const knots = Array.from({ length: PIVOTS }, (_, i) => ({ x: String(i * STEP), y: i > g ? '1' : '0' }))
        const cum = fill({ knots, method, at, precision: 40 }).points.map(p => new H(p.y))
        return cum.slice(1).map((v, k) => v.minus(cum[k]!))
      })
      const table = ref.publishedSplit[method]
      // panels 1, 2 (first groups), 3 (group 6, in the middle), 4, 5 (last groups); published columns are groups around the panel
      const groupOf = [0, 1, 6, PIVOTS - 3, PIVOTS - 2]
      const firstColumn = [0, 0, 4, PIVOTS - 6, PIVOTS - 6]
      table.forEach((panel, p) => panel.forEach((row, year) => row.forEach((published, c) => {
        const g = firstColumn[p]! + c
        const value = perGroup[g]![groupOf[p]! * STEP + year]!
        if (published === null) expect(value.isZero(), `${method} panel ${p + 1} year ${year} group ${c}`).toBe(true)
        else expect(value.toFixed(4), `${method} panel ${p + 1} year ${year} group ${c}`).toBe(new H(published).toFixed(4))
      })))
    }
  })

  it('beers: our minimisation of fifth differences lands within one unit of the fourth decimal of the published coefficients', () => {
    const w = weights('beers', ['33', '34'])
    // interior interval [30, 35]; pivot 9 (offset 3) at s = 3/5 and 4/5
    expect(new H(w[9]![0]!).minus(frac(ref.beersMinimised['s=3/5 on y_3']!)).abs().lt('0.0001')).toBe(true)
    expect(new H(w[9]![1]!).minus(frac(ref.beersMinimised['s=4/5 on y_3']!)).abs().lt('0.0001')).toBe(true)
  })
})

/** A polynomial with coefficients in thousandths, evaluated exactly. */
const poly = (degree: number) => fc.array(fc.integer({ min: -5000, max: 5000 }), { minLength: degree + 1, maxLength: degree + 1 })
const value = (c: number[], x: Decimal) => c.reduceRight((acc, a) => acc.times(x).plus(new H(a).div(1000)), new H(0))

describe('polynomial reproduction (property)', () => {
  const cases: [MethodId, number][] = [['karup-king', 2], ['sprague', 4], ['beers', 4]]
  for (const [method, degree] of cases) {
    it(`${method} reproduces every polynomial of degree ${degree}, everywhere between the pivots`, () => {
      fc.assert(fc.property(poly(degree), fc.integer({ min: 6, max: 11 }), fc.constantFrom('1', '2.5', '5', '10'), fc.integer({ min: -20, max: 60 }), fc.array(fc.integer({ min: 0, max: 999 }), { minLength: 4, maxLength: 8 }), (c, n, h, x0, fractions) => {
        const xs = Array.from({ length: n }, (_, i) => new H(x0).plus(new H(h).times(i)))
        const span = xs[n - 1]!.minus(xs[0]!)
        const at = fractions.map(f => xs[0]!.plus(span.times(f).div(1000)).toString())
        const r = fill({ knots: xs.map(x => ({ x: x.toString(), y: value(c, x).toString() })), method, at, precision: 30 })
        const scale = xs.reduce((m, x) => Decimal.max(m, value(c, x).abs()), new H(1))
        r.points.forEach((p) => {
          const exact = value(c, new H(p.x))
          expect(new H(p.y).minus(exact).abs().lte(scale.times('1e-29')), `${method} at ${p.x}: ${p.y} vs ${exact.toSD(32)}`).toBe(true)
        })
      }), { numRuns: 40 })
    })

    it(`${method} does not reproduce degree ${degree + 1} (the claim is tight)`, () => {
      const c = Array.from({ length: degree + 2 }, (_, k) => (k === degree + 1 ? 1000 : 0)) // x^(degree+1)
      const xs = Array.from({ length: 9 }, (_, i) => new H(i))
      const r = fill({ knots: xs.map(x => ({ x: x.toString(), y: value(c, x).toString() })), method, at: ['4.5', '0.5'], precision: 30 })
      expect(r.points.some(p => new H(p.y).minus(value(c, new H(p.x))).abs().gt('1e-6'))).toBe(true)
    })
  }
})

describe('shape and refusals', () => {
  const knots = [20, 25, 30, 35, 40, 45, 50, 55].map((x, i) => ({ x: String(x), y: String(0.0005 * 1.5 ** i) }))

  it('joins its pieces with a continuous slope (karup-king, beers: C1 and C0 at least) and curvature (sprague: C2)', () => {
    for (const [method, order] of [['karup-king', 1], ['sprague', 2], ['beers', 0]] as [MethodId, number][]) {
      const { pp } = fitRequest({ knots, method, at: ['20'] })
      for (let i = 1; i < pp.coefs.length; i += 1) {
        const h = pp.breaks[i]!.minus(pp.breaks[i - 1]!)
        for (let d = 0; d <= order; d += 1) {
          const left = hornerDerivative(pp.coefs[i - 1]!, h, d)
          const right = hornerDerivative(pp.coefs[i]!, h.times(0), d)
          expect(left.minus(right).abs().lte(left.abs().plus(1).times('1e-40')), `${method} derivative ${d} at ${pp.breaks[i]}`).toBe(true)
        }
      }
    }
  })

  it('refuses unequal spacing with a clear message and code', () => {
    const uneven = [...knots.slice(0, 6), { x: '52', y: '0.01' }, { x: '60', y: '0.02' }]
    for (const method of METHODS) {
      let error: unknown
      try { fill({ knots: uneven, method, at: ['30'] }) }
      catch (e) { error = e }
      expect(error).toBeInstanceOf(EngineError)
      expect((error as EngineError).code).toBe('unequal-spacing')
      expect((error as EngineError).message).toBe(`Method ${method} needs equally spaced points (pivotal values at a fixed step): the step is 5 from 20 to 25 but 7 from 45 to 52. Use a spline, PCHIP or Akima for unequal spacing.`)
    }
  })

  it('needs enough pivots for its panels', () => {
    expect(() => fill({ knots: knots.slice(0, 2), method: 'karup-king', at: ['20'] })).toThrow(/at least 3/)
    expect(() => fill({ knots: knots.slice(0, 4), method: 'sprague', at: ['20'] })).toThrow(/at least 5/)
    expect(() => fill({ knots: knots.slice(0, 5), method: 'beers', at: ['20'] })).toThrow(/at least 6/)
  })

  it('beers says where a point is not at a fifth of the step', () => {
    expect(fill({ knots, method: 'beers', grid: { from: '20', to: '55', step: '1' } }).diagnostics.notes).toEqual([])
    const off = fill({ knots, method: 'beers', at: ['21', '21.5', '22.25'] })
    expect(off.diagnostics.notes).toContain("beers: 2 point(s) are not at fifths of the pivot step (5); there the values come from the quintic through the published fifths, not from Beers' table.")
  })
})
