// The curve methods against independent NumPy/SciPy implementations written from the papers' formulas
// (tests/reference/curves_reference.py): monotone convex from Hagan and West (2006), "Interpolation methods for curve
// construction", Applied Mathematical Finance 13(2), section 4 (g by region, ln P by numerical quadrature); Smith-Wilson
// from the EIOPA technical documentation of the risk-free rate term structures (Wilson matrix solved by numpy.linalg.solve).
import Decimal from 'decimal.js'
import { describe, expect, it } from 'vitest'
import { fill, type Compounding } from '~~/server/engine'
import { fitRequest } from '~~/server/engine/pipeline'
import { hornerDerivative } from '~~/server/engine/piecewise'
import { T, knots } from './helpers'
import { loadReference } from './reference'

interface Fixture {
  scipy: string
  monotoneConvex: { name: string, compounding: Compounding, x: string[], y: string[], at: string[], results: { options: Record<string, string>, lnP: string[], rate: string[], forward: string[] }[] }[]
  smithWilson: { name: string, u: string[], r: string[], options: Record<string, string>, alpha: string, convergencePoint: string, at: string[], rate: string[], intensityAtConvergence: string, omega: string }[]
}

const fixture = loadReference<Fixture>('curves_reference.py', 'curves-fixture.json', 'Curve reference')

/** ln P(t) from a rate under c (Hull, ch. 4), at 60 digits. */
function lnP(t: string, r: string, c: Compounding): Decimal {
  if (new T(t).isZero()) return new T(0)
  const rate = new T(r)
  const F = c === 'continuous' ? rate : c === 'semi-annual' ? rate.div(2).plus(1).ln().times(2) : rate.plus(1).ln()
  return F.times(t).neg()
}

function within(ours: Decimal, theirs: string, rel: string, abs: string): boolean {
  return ours.minus(theirs).abs().lte(Decimal.max(new T(theirs).abs().times(rel), new T(abs)))
}

describe('monotone-convex against an independent NumPy/SciPy implementation (Hagan and West 2006)', () => {
  for (const ds of fixture.monotoneConvex) {
    for (const ref of ds.results) {
      it(`${ds.name}, positivity ${ref.options.positivity}: ln P(t) and the instantaneous forward at ${ds.at.length} terms`, () => {
        const request = { knots: knots(ds.x, ds.y), method: 'monotone-convex' as const, options: ref.options, kind: 'spot-rate' as const, compounding: ds.compounding, at: ds.at }
        const result = fill(request)
        // float64 with quadrature: about 1e-16 on ln P; the engine is exact by comparison
        result.points.forEach((p, k) => {
          if (!within(lnP(p.x, p.y, ds.compounding), ref.lnP[k]!, '1e-13', '1e-15')) expect.fail(`ln P at t = ${p.x}: engine rate ${p.y}, reference ln P ${ref.lnP[k]}`)
        })
        const { pp } = fitRequest(request, null)
        ds.at.forEach((t, k) => {
          // not at a given term: where g0 or g1 is zero the paper's g has a break of zero width there (a spike), which
          // binary floating point turns into a sliver of width 1e-16; ln P is the same either way
          if (ds.x.includes(t)) return
          const x = new T(t)
          let i = pp.breaks.findIndex((b, j) => j + 1 < pp.breaks.length && x.gte(b) && x.lt(pp.breaks[j + 1]!))
          if (i < 0) i = pp.coefs.length - 1
          const f = hornerDerivative(pp.coefs[i]!, new T(x).minus(pp.breaks[i]!), 1).neg()
          if (!within(f, ref.forward[k]!, '1e-12', '1e-14')) expect.fail(`forward at t = ${t}: engine ${f.toString()}, reference ${ref.forward[k]}`)
        })
      })
    }
  }
})

describe('smith-wilson against an independent NumPy implementation (EIOPA zero-coupon formulation)', () => {
  for (const ds of fixture.smithWilson) {
    it(`${ds.name}: alpha ${ds.alpha}, spot rates at ${ds.at.length} terms to 150 years`, () => {
      const result = fill({ knots: knots(ds.u, ds.r), method: 'smith-wilson', options: ds.options, kind: 'spot-rate', extrapolation: 'method', at: ds.at })
      expect(new T(result.spec.options.alpha!).toFixed(6)).toBe(ds.alpha)
      expect(result.spec.options.convergencePoint).toBe(ds.convergencePoint)
      result.points.forEach((p, k) => {
        if (!within(new T(p.y), ds.rate[k]!, '1e-12', '1e-14')) expect.fail(`t = ${p.x}: engine ${p.y}, NumPy ${ds.rate[k]}`)
      })
      const c = result.diagnostics.convergence!
      expect(within(new T(c.forwardIntensity), ds.intensityAtConvergence, '1e-12', '1e-15')).toBe(true)
      expect(within(new T(c.ultimateIntensity), ds.omega, '1e-15', '0')).toBe(true)
    })
  }
})
