// Whittaker-Henderson graduation. Outside references, named beside each check (tests/reference/graduation_reference.py,
// run now when python3 with NumPy, SciPy and mpmath is on PATH, else its committed output graduation-fixture.json):
// - numpy.linalg.solve of the same dense normal equations (W + h K'K) u = W y, tolerance scaled by numpy.linalg.cond;
// - mpmath.lu_solve of the same equations at 60 digits (agreement to 35 digits);
// - the hat matrix trace from numpy and from mpmath at 60 digits; chi-square p-values from scipy.stats.chi2.sf; sign-test p-values from
//   scipy.stats.binom; the grouping-of-signs probability (Stevens 1939) with Python's exact integers;
// - for a very large h, numpy.polyfit's weighted least-squares polynomial of degree z - 1 (the limit of the graduation).
// No published worked example was verified: none is used (a textbook example quoted from memory would prove little).
import Decimal from 'decimal.js'
import fc from 'fast-check'
import { describe, expect, it } from 'vitest'
import { EngineError, graduate, type GraduationPoint } from '~~/server/engine'
import { loadReference } from './reference'

interface Dataset {
  name: string
  order: number
  smoothing: string
  exposureType?: 'central' | 'initial'
  points: GraduationPoint[]
  numpy: string[]
  cond: number
  mpmath: string[]
  effectiveParameters: number
  effectiveParameters60: string
  chiSquare?: { statistic: number, df: number, pValue: number }
  signs: { positive: number, negative: number, pValue: number }
  runs: { positiveGroups: number, pValue: number }
  polyfit?: string[]
}
const fixture = loadReference<{ numpy: string, scipy: string, datasets: Dataset[] }>('graduation_reference.py', 'graduation-fixture.json', 'Graduation reference')
const H = Decimal.clone({ precision: 80 })
const relClose = (a: number, b: number, rel: number) => Math.abs(a - b) <= rel * Math.max(Math.abs(b), 1e-300)

describe('graduation against dense solves of the same normal equations', () => {
  for (const ds of fixture.datasets) {
    describe(ds.name, () => {
      const r = graduate({ points: ds.points, order: ds.order, smoothing: ds.smoothing, precision: 40, ...(ds.exposureType ? { exposureType: ds.exposureType } : {}) })
      const scale = ds.mpmath.reduce((m, v) => Decimal.max(m, new H(v).abs()), new H(0))

      it('equals mpmath.lu_solve at 60 digits to 35 digits', () => {
        r.points.forEach((p, i) => expect(new H(p.y).minus(ds.mpmath[i]!).abs().lte(scale.times('1e-35')), `${p.x}: ${p.y} vs ${ds.mpmath[i]}`).toBe(true))
      })

      it(`equals numpy.linalg.solve within 10 x cond x 2.2e-16 (cond ${ds.cond.toExponential(2)})`, () => {
        const tol = scale.times(Math.max(1e-13, 10 * ds.cond * 2.2e-16))
        r.points.forEach((p, i) => expect(new H(p.y).minus(ds.numpy[i]!).abs().lte(tol), `${p.x}: ${p.y} vs numpy ${ds.numpy[i]}`).toBe(true))
      })

      it('has the hat-matrix trace, signs and groups of numpy / scipy', () => {
        expect(new H(r.diagnostics.effectiveParameters).minus(ds.effectiveParameters60).abs().lte('1e-30')).toBe(true)
        expect(relClose(Number(r.diagnostics.effectiveParameters), ds.effectiveParameters, Math.max(1e-9, 10 * ds.cond * 2.2e-16))).toBe(true)
        expect(r.diagnostics.signs.positive).toBe(ds.signs.positive)
        expect(r.diagnostics.signs.negative).toBe(ds.signs.negative)
        expect(relClose(Number(r.diagnostics.signs.pValue), ds.signs.pValue, 1e-3)).toBe(true)
        expect(r.diagnostics.runs.positiveGroups).toBe(ds.runs.positiveGroups)
        expect(relClose(Number(r.diagnostics.runs.pValue), ds.runs.pValue, 1e-3)).toBe(true)
      })

      if (ds.chiSquare) {
        it('has the chi-square statistic, degrees of freedom and scipy.stats.chi2.sf p-value', () => {
          const c = r.diagnostics.chiSquare!
          expect(relClose(Number(c.statistic), ds.chiSquare!.statistic, 1e-9)).toBe(true)
          expect(relClose(Number(c.degreesOfFreedom), ds.chiSquare!.df, 1e-9)).toBe(true)
          expect(relClose(Number(c.pValue), ds.chiSquare!.pValue, 1e-3), `${c.pValue} vs ${ds.chiSquare!.pValue}`).toBe(true)
          expect(r.diagnostics.deviations.standardised).toBe(true)
          expect(r.diagnostics.distribution!.observed.reduce((s, v) => s + v, 0)).toBe(r.diagnostics.deviations.values.length)
        })
      }

      if (ds.polyfit) {
        it('with a very large h tends to numpy.polyfit\'s weighted least-squares polynomial of degree z - 1', () => {
          r.points.forEach((p, i) => expect(Math.abs(Number(p.y) - Number(ds.polyfit![i])) < 1e-6).toBe(true))
        })
      }
    })
  }
})

describe('graduation from its definition', () => {
  const ages = Array.from({ length: 30 }, (_, i) => String(40 + i))

  it('h = 0 returns the crude values; polynomial data of degree below z come back unchanged for any h (property)', () => {
    const crude = ages.map((x, i) => ({ x, y: String((i * 7919) % 101 / 1000) }))
    expect(graduate({ points: crude, order: 2, smoothing: '0' }).points.map(p => p.y)).toEqual(crude.map(p => new H(p.y).toString()))
    fc.assert(fc.property(fc.integer({ min: 1, max: 4 }), fc.array(fc.integer({ min: -999, max: 999 }), { minLength: 4, maxLength: 4 }), fc.integer({ min: 0, max: 12 }), (z, c, e) => {
      const pts = ages.map((x, i) => ({ x, y: c.slice(0, z).reduceRight((a, k) => a.times(i).plus(k), new H(0)).div(1000).toString(), weight: String(1 + (i % 5)) }))
      const r = graduate({ points: pts, order: z, smoothing: new H(10).pow(e).toString(), precision: 30 })
      r.points.forEach((p, i) => expect(new H(p.y).minus(pts[i]!.y).abs().lte('1e-27')).toBe(true))
    }), { numRuns: 25 })
  })

  it('agrees at p digits with a run at p + 60 digits, with large smoothing too (precision budget, property)', () => {
    fc.assert(fc.property(fc.integer({ min: 6, max: 40 }), fc.integer({ min: 0, max: 9 }), fc.integer({ min: 1, max: 4 }), (p, e, z) => {
      const pts = ages.map((x, i) => ({ x, y: String(((i * 7919) % 101 + 1) / 997), weight: String(1 + (i % 3)) }))
      const lo = graduate({ points: pts, order: z, smoothing: `1e${e}`, precision: p })
      const hi = graduate({ points: pts, order: z, smoothing: `1e${e}`, precision: p + 60 })
      const scale = hi.points.reduce((m, q) => Decimal.max(m, new H(q.y).abs()), new H(0))
      lo.points.forEach((q, i) => {
        const exact = new H(hi.points[i]!.y)
        const ulp = exact.isZero() ? new H(0) : new H(10).pow(exact.e - p + 1)
        expect(new H(q.y).minus(exact).abs().lte(ulp.div(2).plus(scale.times(new H(10).pow(-(p + 2))))), `p ${p} h 1e${e} z ${z} at ${q.x}`).toBe(true)
      })
    }), { numRuns: 30 })
  })

  it('takes y = deaths / exposure and weights = exposure when they are not given', () => {
    const pts = [0, 1, 2, 3, 4, 5].map(i => ({ x: String(60 + i), deaths: String(10 + i), exposure: String(1000 + 10 * i) }))
    const a = graduate({ points: pts, order: 2, smoothing: '100' })
    const b = graduate({ points: pts.map(p => ({ x: p.x, y: new H(p.deaths).div(p.exposure).toString(), weight: p.exposure })), order: 2, smoothing: '100' })
    expect(a.points).toEqual(b.points)
    expect(a.spec.weights).toBe('exposure')
    expect(b.spec.weights).toBe('given')
    expect(a.diagnostics.chiSquare).not.toBeNull()
    expect(b.diagnostics.chiSquare).toBeNull()
  })

  it('refuses what it cannot graduate, with clear messages', () => {
    const msg = (f: () => unknown) => { try { f(); return null } catch (e) { return e instanceof EngineError ? `${e.code}: ${e.message}` : String(e) } }
    const pts = ages.slice(0, 6).map(x => ({ x, y: '0.01' }))
    expect(msg(() => graduate({ points: [...pts.slice(0, 5), { x: '46', y: '0.01' }], order: 2, smoothing: '1' }))).toMatch(/^unequal-spacing: Graduation needs equally spaced points/)
    expect(msg(() => graduate({ points: pts.slice(0, 3), order: 3, smoothing: '1' }))).toBe('too-few-points: Graduation of order 3 needs at least 4 points; 3 were given.')
    expect(msg(() => graduate({ points: pts.map(p => ({ ...p, weight: '0' })), order: 2, smoothing: '1' }))).toMatch(/^too-few-points: The graduation has no unique answer/)
    expect(msg(() => graduate({ points: [{ ...pts[0]!, weight: '-1' }, ...pts.slice(1)], order: 2, smoothing: '1' }))).toMatch(/weight cannot be negative/)
    expect(msg(() => graduate({ points: pts, order: 7, smoothing: '1' }))).toMatch(/^invalid-option: Order must be a whole number from 1 to 6/)
    expect(msg(() => graduate({ points: pts, order: 2, smoothing: '-1' }))).toBe('invalid-option: Smoothing must be 0 or more; got -1.')
    expect(msg(() => graduate({ points: [{ x: '1' }, ...pts], order: 2, smoothing: '1' }))).toMatch(/needs y, or deaths and exposure/)
    // at 6 digits (16 working) a condition number near 1e30 cannot be refined to the stated precision
    const wild = ages.map((x, i) => ({ x, y: String(i % 2), weight: i === 0 ? '1e-20' : '1e-20' }))
    expect(msg(() => graduate({ points: wild, order: 4, smoothing: '1e12', precision: 6 }))).toMatch(/^ill-conditioned: The smoothing is too large for 6 digits/)
  })
})
