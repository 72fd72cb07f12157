// Monotone convex (Hagan and West 2006, "Interpolation methods for curve construction", Applied Mathematical Finance
// 13(2), section 4; Hagan and West 2008, "Methods for constructing a yield curve", Wilmott). Checks from the paper's
// definitions: discrete forwards kept, positivity, locality, and the paper's example data (from memory) worked by hand.
// The point-by-point comparison with an independent implementation is in curve-reference.test.ts.
import fc from 'fast-check'
import { describe, expect, it } from 'vitest'
import { fill, type FillRequest } from '~~/server/engine'
import { horner, hornerDerivative, type PiecewisePolynomial } from '~~/server/engine/piecewise'
import { fitRequest } from '~~/server/engine/pipeline'
import { T, engineErrorOf, knots } from './helpers'

// Hagan and West (2006), example used throughout the paper: terms 1..5, continuously compounded rates 3, 4, 4.7, 6, 6 %
// (from memory). Discrete forwards: 0.03, 0.05, 0.061, 0.099, 0.06.
const HW: FillRequest = { knots: knots([1, 2, 3, 4, 5], ['0.03', '0.04', '0.047', '0.06', '0.06']), method: 'monotone-convex', kind: 'spot-rate', compounding: 'continuous', at: ['1'] }

function pieces(request: FillRequest): PiecewisePolynomial {
  return fitRequest(request, null).pp
}

/** f(t) = -d ln P/dt from the right at t (the piece starting at or before t). */
function forwardAt(pp: PiecewisePolynomial, t: string): InstanceType<typeof T> {
  const x = new T(t)
  let i = 0
  while (i + 1 < pp.coefs.length && pp.breaks[i + 1]!.lte(x)) i += 1
  return hornerDerivative(pp.coefs[i]!, x.minus(pp.breaks[i]!), 1).neg()
}

/** The smallest forward on each piece: f = -(c1 + 2 c2 u + 3 c3 u^2) is a quadratic in u; its minimum is at an end or at the vertex. */
function smallestForward(pp: PiecewisePolynomial): InstanceType<typeof T> {
  let min = new T(Infinity)
  pp.coefs.forEach((c, i) => {
    const w = pp.breaks[i + 1]!.minus(pp.breaks[i]!)
    const candidates = [new T(0), new T(w)]
    if (!c[3]!.isZero()) {
      const vertex = new T(c[2]!).neg().div(new T(c[3]!).times(3))
      if (vertex.gt(0) && vertex.lt(w)) candidates.push(vertex)
    }
    for (const u of candidates) {
      const f = hornerDerivative(c, u, 1).neg()
      if (f.lt(min)) min = f
    }
  })
  return min
}

describe('monotone-convex (Hagan and West 2006)', () => {
  it('the paper\'s example (from memory): forwards at the terms as worked by hand from the paper\'s formulas', () => {
    // f_i = (h_i f^d_{i+1} + h_{i+1} f^d_i) / (h_i + h_{i+1}); f_0 = f^d_1 - (f_1 - f^d_1)/2; f_5 = f^d_5 - (f_4 - f^d_5)/2
    const pp = pieces(HW)
    const expected = { 0: '0.025', 1: '0.04', 2: '0.0555', 3: '0.08', 4: '0.0795' }
    for (const [t, f] of Object.entries(expected)) expect(forwardAt(pp, t).toString(), `f(${t})`).toBe(new T(f).toString())
    // the last one from the left: the end of the last piece
    const last = pp.coefs.length - 1
    expect(hornerDerivative(pp.coefs[last]!, pp.breaks[last + 1]!.minus(pp.breaks[last]!), 1).neg().toString()).toBe('0.05025')
    // r(0) is the instantaneous forward at 0
    expect(fill({ ...HW, at: ['0'] }).points[0]!.y).toBe('0.025')
  })

  it('keeps every discrete forward: the given rates exactly, and each interval\'s pieces reach the next given ln P', () => {
    for (const request of [HW, { ...HW, knots: knots(['0.25', '0.5', '1', '2', '3', '5', '7', '10', '15', '20', '30'], ['0.0412', '0.0405', '0.0391', '0.0368', '0.0355', '0.0349', '0.0352', '0.0361', '0.0375', '0.0381', '0.0372']), compounding: 'annual' as const }]) {
      const r = fill({ ...request, at: request.knots.map(k => k.x) })
      expect(r.points.map(p => p.y)).toEqual(request.knots.map(k => new T(k.y).toString()))
      const pp = pieces(request)
      // ln P at the right end of every piece, from that piece, against the next piece's start (or the last knot)
      pp.coefs.forEach((c, i) => {
        const end = horner(c, pp.breaks[i + 1]!.minus(pp.breaks[i]!))
        const next = i + 1 < pp.coefs.length ? pp.coefs[i + 1]![0]! : pp.endValue
        expect(end.minus(next).abs().lt('1e-45'), `piece ${i}`).toBe(true)
      })
    }
  })

  const spiky = knots(['0.5', '1', '2', '2.5', '4', '5'], ['0.09', '0.05', '0.07', '0.06', '0.045', '0.046']) // discrete forwards 0.09, 0.01, 0.09, 0.02, 0.02, 0.05
  it('positivity: positive discrete forwards give positive forwards everywhere; without the step they go negative', () => {
    const base: FillRequest = { knots: spiky, method: 'monotone-convex', kind: 'spot-rate', compounding: 'continuous', at: ['1'] }
    expect(smallestForward(pieces(base)).gte(0)).toBe(true)
    expect(smallestForward(pieces({ ...base, options: { positivity: 'off' } })).lt(0)).toBe(true)
    const check = fill({ ...base, at: undefined, grid: { from: '0', to: '5', step: '0.01' } })
    expect(check.diagnostics.forwards!.negativeCount).toBe(0)
  })

  it('positivity holds on random positive discrete forwards (property)', () => {
    fc.assert(fc.property(fc.array(fc.tuple(fc.integer({ min: 1, max: 40 }), fc.integer({ min: 1, max: 20000 })), { minLength: 2, maxLength: 9 }), (rows) => {
      // terms from steps of 0.25 .. 10, discrete forwards 0.00001 .. 0.2, continuous ln P accumulated exactly
      let t = new T(0)
      let lnP = new T(0)
      const k = rows.map(([step, fd]) => {
        const h = new T(step).div(4)
        t = t.plus(h)
        lnP = lnP.minus(new T(fd).div(100000).times(h))
        return { x: t.toString(), y: lnP.neg().div(t).toString() }
      })
      const pp = pieces({ knots: k, method: 'monotone-convex', kind: 'spot-rate', compounding: 'continuous', at: ['0'], precision: 30 })
      expect(smallestForward(pp).gte('-1e-30')).toBe(true)
    }), { numRuns: 60 })
  })

  it('is local: moving one rate changes the curve only over the two intervals on each side (exactly nothing elsewhere)', () => {
    const terms = ['1', '2', '3', '4', '5', '6', '7', '8', '9', '10', '11']
    const rates = ['0.031', '0.033', '0.034', '0.036', '0.035', '0.037', '0.038', '0.0375', '0.039', '0.04', '0.0405']
    const at = Array.from({ length: 111 }, (_, k) => (k / 10).toString())
    const base = fill({ knots: knots(terms, rates), method: 'monotone-convex', kind: 'spot-rate', at })
    const bumped = fill({ knots: knots(terms, rates.map((r, i) => (i === 5 ? '0.0351' : r))), method: 'monotone-convex', kind: 'spot-rate', at })
    const moved = base.points.filter((p, k) => p.y !== bumped.points[k]!.y).map(p => Number(p.x))
    // the bumped term is 6: intervals (4, 5], (5, 6], (6, 7], (7, 8] may move, nothing else
    expect(Math.min(...moved)).toBeGreaterThan(4)
    expect(Math.max(...moved)).toBeLessThan(8)
    expect(base.diagnostics.bump!.changed!.intervals).toBeLessThanOrEqual(4)
  })

  it('reproduces flat forwards everywhere and linear forwards on the inner intervals (ln P quadratic in t), any spacing (property)', () => {
    fc.assert(fc.property(fc.uniqueArray(fc.integer({ min: 1, max: 400 }), { minLength: 4, maxLength: 9 }), fc.integer({ min: 1, max: 900 }), fc.integer({ min: -30, max: 30 }), (raw, a0, b0) => {
      const terms = [...raw].sort((p, q) => p - q).map(v => new T(v).div(10))
      const a = new T(a0).div(10000)
      const b = new T(b0).div(100000)
      // f(t) = a + b t, ln P(t) = -(a t + b t^2 / 2): continuous rate r = a + b t / 2
      const k = terms.map(t => ({ x: t.toString(), y: a.plus(b.times(t).div(2)).toString() }))
      const pp = pieces({ knots: k, method: 'monotone-convex', kind: 'spot-rate', compounding: 'continuous', at: ['0'], options: { positivity: 'off' } })
      for (let i = 1; i + 2 < terms.length; i += 1) {
        const t = terms[i]!.plus(terms[i + 1]!).div(2)
        expect(forwardAt(pp, t.toString()).minus(a.plus(b.times(t))).abs().lt('1e-40')).toBe(true)
      }
      const flat = pieces({ knots: terms.map(t => ({ x: t.toString(), y: a.toString() })), method: 'monotone-convex', kind: 'spot-rate', compounding: 'continuous', at: ['0'] })
      expect(smallestForward(flat).minus(a).abs().lt('1e-40')).toBe(true)
    }), { numRuns: 40 })
  })

  it('fills discount factors on the same ln P(t) as the equivalent spot rates', () => {
    const terms = ['1', '2', '3', '4', '5']
    const dfs = ['0.03', '0.04', '0.047', '0.06', '0.06'].map((r, i) => new T(r).times(terms[i]!).neg().exp().toSignificantDigits(45).toString())
    const at = ['0.5', '1.5', '2.25', '4.9']
    const fromRates = fill({ ...HW, at })
    const fromFactors = fill({ knots: knots(terms, dfs), method: 'monotone-convex', kind: 'discount-factor', at })
    fromFactors.points.forEach((p, k) => {
      const viaRate = new T(fromRates.points[k]!.y).times(p.x).neg()
      expect(new T(p.y).ln().minus(viaRate).abs().lt('1e-38')).toBe(true)
    })
    expect(fill({ knots: knots(terms, dfs), method: 'monotone-convex', kind: 'discount-factor', at: ['0'] }).points[0]!.y).toBe('1')
  })

  it('continues beyond the last term with the last forward under linear extrapolation (flat forward on ln P)', () => {
    const r = fill({ ...HW, extrapolation: 'linear', at: ['5', '6', '8'] })
    // ln P(t) = ln P(5) - f_5 (t - 5), f_5 = 0.05025 (continuous)
    const lnP5 = new T('-0.3')
    for (const p of r.points.slice(1)) {
      const expected = lnP5.minus(new T('0.05025').times(new T(p.x).minus(5))).div(p.x).neg()
      expect(new T(p.y).minus(expected).abs().lt('1e-38')).toBe(true)
    }
  })

  it('refuses what it does not apply to, saying why', () => {
    expect(engineErrorOf({ ...HW, kind: 'mortality', compounding: undefined }).message).toBe("Method monotone-convex fills spot-rate and discount-factor tables; this table's kind is 'mortality'.")
    expect(engineErrorOf({ ...HW, kind: 'mortality', compounding: undefined }).code).toBe('not-applicable')
    expect(engineErrorOf({ ...HW, transform: 'log' }).message).toBe("Method monotone-convex already works on ln P(t); use transform 'none' with it.")
    expect(engineErrorOf({ ...HW, extrapolation: 'method' }).message).toBe("Method monotone-convex has no extension of its own beyond the knots; choose extrapolation 'error', 'flat' or 'linear'.")
    const e = engineErrorOf({ knots: knots([0, 1, 2], ['0.99', '0.97', '0.94']), method: 'monotone-convex', kind: 'discount-factor', at: ['1'] })
    expect(e.message).toBe("Point 1 (x = 0): y '0.99' is outside the domain; monotone-convex works on ln P(t) and needs t >= 0, P > 0, and P = 1 at t = 0.")
  })
})
