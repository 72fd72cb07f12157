// The precision budget (server/engine/precision.ts, docs/methods.md "Precision budget"): a result at p digits is within
// half a unit in its last place, plus 10^-(p + MARGIN_DIGITS) of the scale, of the method's exact value, here taken from a
// run at p + 60 digits (its own error is 60 digits smaller). Also: fraction steps are resolved by the engine, as the
// server's explicit lists were before engine 1.4.0, and the forward-rate scan's float shortcut has a derived bound.
import Decimal from 'decimal.js'
import fc from 'fast-check'
import { describe, expect, it } from 'vitest'
import { compare, EngineError, fill, METHODS, type FillRequest, type MethodId, type TransformId } from '~~/server/engine'
import { MARGIN_DIGITS, GUARD_DIGITS } from '~~/server/engine/precision'
import { decimalContext } from '~~/server/engine/decimal'
import { resolvePoints } from '~~/server/engine/grid'

const H = Decimal.clone({ precision: 400 })

/** 3..10 knots; x equally spaced (step from 1 to 5) or at random hundredths; y in thousandths, positive. */
const dataset = fc.record({
  equal: fc.boolean(),
  step: fc.integer({ min: 1, max: 5 }),
  xs: fc.uniqueArray(fc.integer({ min: 0, max: 20000 }), { minLength: 7, maxLength: 10 }),
  ys: fc.array(fc.integer({ min: 1, max: 999999 }), { minLength: 10, maxLength: 10 }),
  p: fc.integer({ min: 6, max: 45 }),
})

function knotsOf(d: { equal: boolean, step: number, xs: number[], ys: number[] }, count: number) {
  const xs = d.equal ? Array.from({ length: count }, (_, i) => new H(i * d.step)) : [...d.xs].sort((a, b) => a - b).slice(0, count).map(x => new H(x).div(100))
  return xs.map((x, i) => ({ x: x.toString(), y: new H(d.ys[i]!).div(1000).toString() }))
}

/** Five points inside the knots, not at them. */
function inside(kn: { x: string }[]): string[] {
  const lo = new H(kn[0]!.x)
  const hi = new H(kn.at(-1)!.x)
  return [1, 3, 5, 7, 9].map(k => lo.plus(hi.minus(lo).times(k).div(10.3)).toDecimalPlaces(6).toString())
}

function ulp(y: Decimal, p: number): Decimal {
  return y.isZero() ? new H(0) : new H(10).pow(y.abs().e - p + 1)
}

function check(request: FillRequest, p: number, scale: (y: Decimal) => Decimal): void {
  let low: ReturnType<typeof fill>
  try {
    low = fill({ ...request, precision: p })
  }
  catch (e) {
    // random rates at terms a hundredth apart can give a Smith-Wilson curve no positive discount factor: refused, not a precision question
    fc.pre(!(request.method === 'smith-wilson' && e instanceof EngineError && e.code === 'transform-domain'))
    throw e
  }
  const high = fill({ ...request, precision: p + 60 })
  low.points.forEach((pt, k) => {
    const exact = new H(high.points[k]!.y)
    const error = new H(pt.y).minus(exact).abs()
    const allowed = ulp(exact, p).div(2).plus(scale(exact).times(new H(10).pow(-(p + MARGIN_DIGITS))))
    if (error.gt(allowed)) expect.fail(`${request.method} on ${request.transform}: p = ${p} at x = ${pt.x}: ${pt.y} vs ${exact.toSD(p + 5)} (error ${error.toSD(3)}, allowed ${allowed.toSD(3)})`)
  })
}

describe('precision budget', () => {
  it('spends its guard digits as documented', () => {
    expect(GUARD_DIGITS).toBe(10)
    const r = fill({ knots: [{ x: '0', y: '1' }, { x: '1', y: '2' }], method: 'linear', at: ['0.5'], precision: 17 })
    expect(r.spec.workingPrecision).toBe(17 + GUARD_DIGITS)
  })

  for (const listing of METHODS) {
    const id = listing.id as MethodId
    for (const transform of ['none', 'log'] as TransformId[]) {
      // log-linear works on ln y, the curve methods on ln P(t), by construction: they take transform none only
      if (['log-linear', 'monotone-convex', 'smith-wilson'].includes(listing.id) && transform === 'log') continue
      // curve methods fill spot rates only: the values are read as rates up to 10 %
      const curve = !listing.appliesTo.kinds.includes('other')
      it(`${id} on ${transform}: results at p digits agree with a run at p + 60 digits (property)`, () => {
        fc.assert(fc.property(dataset, (d) => {
          // methods for equally spaced pivots get equal spacing (they refuse anything else)
          const kn = knotsOf({ ...d, equal: d.equal || listing.appliesTo.spacing === 'equal', ys: curve ? d.ys.map(y => y / 10000) : d.ys }, Math.max(listing.minPoints, 7))
          const maxY = kn.reduce((m, k) => Decimal.max(m, new H(k.y).abs()), new H(0))
          const request: FillRequest = { knots: kn, method: id, transform, at: inside(kn), ...(curve ? { kind: 'spot-rate' as const } : {}) }
          // fit scale none: the largest |y|; on log the error is relative to the value itself
          check(request, d.p, y => (transform === 'none' ? maxY : y.abs()))
        }), { numRuns: 12 })
      })
    }
  }
})

describe('fraction steps are resolved by the engine', () => {
  /** What the server sent before engine 1.4.0 (server/services/fill-request.ts gridToEngine): an explicit list at 60 digits. */
  function oldList(from: string, to: string, num: number, den: number): string[] {
    const X = Decimal.clone({ precision: 60, rounding: Decimal.ROUND_HALF_EVEN })
    const step = new X(num).div(den)
    const at: string[] = []
    for (let k = 0; ; k += 1) {
      const x = new X(from).plus(new X(k).times(num).div(den))
      if (x.gt(new X(to).plus(step.div(1e6)))) break
      at.push(x.toDecimalPlaces(12).toString())
    }
    return at
  }
  const curve = [['0.25', '0.031'], ['1', '0.029'], ['5', '0.027'], ['10', '0.0285'], ['30', '0.03']].map(([x, y]) => ({ x: x!, y: y! }))

  it('gives the same points and values as the old explicit list, and records step and places', () => {
    const byGrid = fill({ knots: curve, method: 'pchip', kind: 'spot-rate', grid: { from: '0.25', to: '30', step: '1/12' } })
    const at = oldList('0.25', '30', 1, 12)
    const byList = fill({ knots: curve, method: 'pchip', kind: 'spot-rate', at })
    expect(at).toHaveLength(358)
    expect(byGrid.points).toEqual(byList.points)
    expect(byGrid.spec.grid).toEqual({ from: '0.25', to: '30', step: '1/12', places: 12 })
    expect(byGrid.spec.at).toBeNull()
    expect(byGrid.points[1]!.x).toBe('0.333333333333')
    expect(byGrid.points[9]!.x).toBe('1')
  })

  it('re-runs the saved spec digit for digit, and an old saved list still re-runs', () => {
    const first = fill({ knots: curve, method: 'cubic-natural', kind: 'spot-rate', extrapolation: 'flat', grid: { from: '0', to: '2', step: '1/12', places: 6 } })
    expect(first.points[1]!.x).toBe('0.083333')
    const again = fill({ knots: curve, method: 'cubic-natural', kind: 'spot-rate', extrapolation: 'flat', grid: first.spec.grid!, precision: first.spec.precision })
    expect(again.points).toEqual(first.points)
    const old = fill({ knots: curve, method: 'cubic-natural', kind: 'spot-rate', at: oldList('0.25', '30', 1, 12) })
    const oldAgain = fill({ knots: curve, method: 'cubic-natural', kind: 'spot-rate', at: old.spec.at! })
    expect(oldAgain.points).toEqual(old.points)
  })

  it('matches the old list for other fractions and ends (property)', () => {
    fc.assert(fc.property(fc.integer({ min: 0, max: 400 }), fc.integer({ min: 1, max: 2000 }), fc.integer({ min: 1, max: 7 }), fc.integer({ min: 2, max: 53 }), (from, span, num, den) => {
      const f = new H(from).div(4).toString()
      const t = new H(from).div(4).plus(new H(span).div(20)).toString()
      const D = decimalContext(50)
      const points = resolvePoints(D, { from: f, to: t, step: `${num}/${den}` }, undefined)
      expect(points.xs.map(x => x.toString())).toEqual(oldList(f, t, num, den))
    }), { numRuns: 200 })
  })

  it('refuses a fraction step below the last decimal place, and places with a decimal step', () => {
    expect(() => fill({ knots: curve, method: 'linear', grid: { from: '1', to: '2', step: '1/3000', places: 3 } })).toThrow(/below 10\^-3/)
    expect(() => fill({ knots: curve, method: 'linear', grid: { from: '1', to: '2', step: '0.5', places: 3 } })).toThrow(/fraction step/)
    expect(() => fill({ knots: curve, method: 'linear', grid: { from: '1', to: '2', step: '1/0' } })).toThrow(/greater than 0/)
  })

  it('compare resolves the grid once and gives each method the same values as its own fill', () => {
    const request: FillRequest = { knots: curve, method: 'linear', kind: 'spot-rate', grid: { from: '0.25', to: '30', step: '1/12' }, precision: 30 }
    const res = compare(request, [{ method: 'linear' }, { method: 'akima' }])
    for (const entry of res.entries) {
      if (!entry.ok) expect.fail(entry.error)
      expect(entry.result.points).toEqual(fill({ ...request, method: entry.result.spec.method }).points)
    }
  })
})

describe('forward-rate scan: float shortcut with a derived error bound', () => {
  it('finds a negative forward that binary floating point reports as positive (the old 1e-9 guess missed it)', () => {
    // found by a search over close terms: the exact forward is -0.0000335607 (continuous), the float one +0.0111
    const knots = [{ x: '10.17', y: '0.05238279679686764' }, { x: '10.17000000000001', y: '0.05238279679686758713200927855797214598215' }]
    const r = fill({ knots, method: 'linear', kind: 'spot-rate', at: knots.map(k => k.x) })
    const f = r.diagnostics.forwards!
    expect(f.negativeCount).toBe(1)
    expect(Number(f.minimum!.value)).toBeCloseTo(Math.expm1(-0.0000335607), 9)
  })

  it('agrees with the exact sign on random close terms (property)', () => {
    const D = Decimal.clone({ precision: 80 })
    fc.assert(fc.property(fc.integer({ min: 1, max: 3000 }), fc.integer({ min: 8, max: 17 }), fc.integer({ min: 1, max: 99999 }), fc.double({ min: -1, max: 1, noNaN: true }), fc.integer({ min: 3, max: 9 }), (t, gap, rate, wobble, size) => {
      const t1 = new D(t).div(100)
      const dt = new D(10).pow(-gap)
      const r1 = new D(rate).div(1e6)
      const L2 = t1.times(r1.plus(1).ln()).plus(new D(wobble).times(new D(10).pow(-size)).times(dt))
      const r2 = L2.div(t1.plus(dt)).exp().minus(1).toSD(40)
      const exact = t1.plus(dt).times(r2.plus(1).ln()).minus(t1.times(r1.plus(1).ln()))
      const knots = [{ x: t1.toString(), y: r1.toString() }, { x: t1.plus(dt).toString(), y: r2.toString() }]
      const r = fill({ knots, method: 'linear', kind: 'spot-rate', at: knots.map(k => k.x) })
      expect(r.diagnostics.forwards!.negativeCount).toBe(exact.isNegative() && !exact.isZero() ? 1 : 0)
    }), { numRuns: 300 })
  })
})
