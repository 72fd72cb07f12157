// Exact evaluation of the pieces (server/engine/exact.ts, evaluate.ts). References:
// - decimal.js at 1,000 significant digits (a general-purpose arbitrary-precision library): with 50-digit coefficients and
//   short points every Horner step fits, so its Horner value is the exact polynomial value; toSignificantDigits with
//   ROUND_HALF_EVEN then gives the correctly rounded result (IEEE 754-2008, 4.3.1 roundTiesToEven, for decimal formats).
// - Tabulation by forward differences equals direct evaluation in exact arithmetic (Knuth, TAOCP vol. 2, 4.6.4).
import fc from 'fast-check'
import Decimal from 'decimal.js'
import { describe, expect, it } from 'vitest'
import { decimalContext, exp } from '~~/server/engine/decimal'
import { evaluateAscending } from '~~/server/engine/evaluate'
import { roundScaled, toScaled } from '~~/server/engine/exact'
import type { PiecewisePolynomial } from '~~/server/engine/piecewise'
import { fill } from '~~/server/engine'

const W = decimalContext(50)
const Big = Decimal.clone({ precision: 1000, rounding: Decimal.ROUND_HALF_EVEN })

describe('toScaled (a Decimal as an integer times a power of ten)', () => {
  it('agrees with decimal.js toFixed at the same scale, and refuses a scale that would drop digits', () => {
    fc.assert(fc.property(fc.bigInt({ min: -(10n ** 60n), max: 10n ** 60n }), fc.integer({ min: -30, max: 70 }), fc.integer({ min: 0, max: 80 }), (int, exponent, scale) => {
      const d = new W(`${int.toString()}e${exponent}`)
      const ours = toScaled(d, scale)
      if (d.decimalPlaces() > scale) expect(ours).toBeNull()
      else expect(ours).toBe(BigInt(new Big(d.toString()).times(new Big(10).pow(scale)).toFixed(0)))
    }), { numRuns: 2000 })
  })
})

describe('roundScaled (one half-even rounding of an exact scaled integer)', () => {
  it('agrees with decimal.js toSignificantDigits(ROUND_HALF_EVEN) on random integers, scales and digit counts', () => {
    fc.assert(fc.property(fc.bigInt({ min: -(10n ** 70n), max: 10n ** 70n }), fc.integer({ min: -20, max: 90 }), fc.integer({ min: 1, max: 60 }), (int, scale, digits) => {
      const ours = roundScaled(int, scale, digits, W)
      const ref = new Big(`${int.toString()}e${-scale}`).toSignificantDigits(digits, Decimal.ROUND_HALF_EVEN)
      expect(ours.toString()).toBe(new W(ref.toString()).toString())
    }), { numRuns: 2000 })
  })

  it('rounds exact ties to the even neighbour, and a tie followed by any non-zero digit up', () => {
    const cases: [bigint, string][] = [
      [125n, '1.2'], [135n, '1.4'], [-125n, '-1.2'], [-135n, '-1.4'], [1251n, '1.3'], [12500000000000000000001n, '1.3'], [995n, '10'], [-995n, '-10'],
    ]
    for (const [int, expected] of cases) {
      const scale = int.toString().replace('-', '').length - 1
      expect(roundScaled(int, scale, 2, W).toString()).toBe(expected)
    }
  })
})

/** A piecewise cubic with random 50-digit coefficients on breaks given as hundredths. */
const piecewise = fc.uniqueArray(fc.integer({ min: -5000, max: 5000 }), { minLength: 2, maxLength: 8 }).chain(raw =>
  fc.tuple(
    fc.constant([...raw].sort((a, b) => a - b)),
    fc.array(fc.array(fc.bigInt({ min: -(10n ** 50n), max: 10n ** 50n }), { minLength: 4, maxLength: 4 }), { minLength: raw.length - 1, maxLength: raw.length - 1 }),
    fc.array(fc.integer({ min: -8, max: 12 }), { minLength: 4, maxLength: 4 }),
  ))

function toPP([breaks, coefs, exps]: [number[], bigint[][], number[]]): PiecewisePolynomial {
  const c = coefs.map(row => row.map((v, k) => new W(`${v.toString()}e${-50 - exps[k]!}`)))
  return { breaks: breaks.map(b => new W(b).div(100)), coefs: c, endValue: c[c.length - 1]![0]! }
}

function reference(pp: PiecewisePolynomial, x: Decimal, digits: number): string {
  const last = pp.coefs.length - 1
  let i = 0
  while (i < last && x.gte(pp.breaks[i + 1]!)) i += 1
  if (x.gte(pp.breaks[last + 1]!)) return pp.endValue.toSignificantDigits(digits, Decimal.ROUND_HALF_EVEN).toString()
  const t = new Big(x.toString()).minus(new Big(pp.breaks[i]!.toString()))
  let v = new Big(pp.coefs[i]![3]!.toString())
  for (let k = 2; k >= 0; k -= 1) v = v.times(t).plus(new Big(pp.coefs[i]![k]!.toString()))
  return new W(v.toSignificantDigits(digits, Decimal.ROUND_HALF_EVEN).toString()).toString()
}

describe('exact evaluation of the pieces', () => {
  it('at any ascending points equals the exact value rounded once (decimal.js at 1,000 digits)', () => {
    fc.assert(fc.property(piecewise, fc.array(fc.integer({ min: 0, max: 100000 }), { minLength: 1, maxLength: 30 }), fc.integer({ min: 6, max: 50 }), (data, fractions, digits) => {
      const pp = toPP(data)
      const lo = pp.breaks[0]!
      const span = pp.breaks[pp.breaks.length - 1]!.minus(lo)
      const xs = fractions.sort((a, b) => a - b).map(f => lo.plus(span.times(f).div(100000)))
      const ours = evaluateAscending(pp, xs, 'flat', digits).map(v => v.toString())
      expect(ours).toEqual(xs.map(x => reference(pp, x, digits)))
    }), { numRuns: 300 })
  })

  it('on a uniform grid (forward differences) equals the same points evaluated one by one', () => {
    fc.assert(fc.property(piecewise, fc.integer({ min: -3000, max: 3000 }), fc.integer({ min: 1, max: 997 }), fc.integer({ min: 1, max: 400 }), (data, from, step, count) => {
      const pp = toPP(data)
      const grid = { from: new W(from).div(100), step: new W(step).div(1000) }
      const xs = Array.from({ length: count }, (_, k) => grid.from.plus(grid.step.times(k)))
      const stepped = evaluateAscending(pp, xs, 'linear', 40, grid).map(v => v.toString())
      const oneByOne = evaluateAscending(pp, xs, 'linear', 40).map(v => v.toString())
      expect(stepped).toEqual(oneByOne)
      const inside = xs.map((x, k) => [x, k] as const).filter(([x]) => x.gte(pp.breaks[0]!) && x.lte(pp.breaks[pp.breaks.length - 1]!))
      for (const [x, k] of inside) expect(stepped[k]).toBe(reference(pp, x, 40))
    }), { numRuns: 300 })
  })
})

describe('a fill on a grid and at the same points listed', () => {
  it('gives the same digits (grid stepping and point-by-point evaluation agree)', () => {
    const knots = [['0', '0.0123'], ['1.7', '0.0171'], ['3', '0.019'], ['7.25', '0.0242'], ['10', '0.0251'], ['20', '0.0302']].map(([x, y]) => ({ x: x!, y: y! }))
    for (const method of ['linear', 'quadratic', 'cubic-natural', 'pchip', 'akima'] as const) {
      const grid = fill({ knots, method, grid: { from: '0', to: '20', step: '0.0833' }, precision: 40 })
      const listed = fill({ knots, method, at: grid.points.map(p => p.x), precision: 40 })
      expect(listed.points).toEqual(grid.points)
    }
  })

  it('still works when the grid cannot be stepped exactly (a 60-digit start at 50 working digits)', () => {
    const knots = [{ x: '0', y: '1' }, { x: '2', y: '3' }, { x: '4', y: '2' }]
    const from = `0.${'1'.repeat(59)}`
    const r = fill({ knots, method: 'cubic-natural', grid: { from, to: '3', step: '0.5' }, precision: 40 })
    const listed = fill({ knots, method: 'cubic-natural', at: r.points.map(p => p.x), precision: 40 })
    expect(r.points).toHaveLength(6)
    expect(listed.points).toEqual(r.points)
  })
})

// e^v: the engine's exp (e^n from decimal.js, cached; the remainder e^(v-n), |v-n| <= 1/2, on scaled integers) against
// decimal.js's exp at 300 digits (documented as correctly rounded). Error bound (standard floating-point analysis, e.g.
// Higham, Accuracy and Stability of Numerical Algorithms, 2nd ed., 2002, ch. 2): each factor is rounded to d significant
// digits (relative error at most 1/2 * 10^(1-d) each) and the product once more, so at most 1.5 * 10^(1-d) relative to
// first order; with n = 0 a single rounding, 1/2 * 10^(1-d), plus expSmall's own error below 10^-(d+8).
describe('exp (transforms and money)', () => {
  const Ref = Decimal.clone({ precision: 300, rounding: Decimal.ROUND_HALF_EVEN })
  it('stays within the rounding bound for any precision the engine uses', () => {
    fc.assert(fc.property(fc.double({ min: -700, max: 700, noNaN: true }), fc.integer({ min: 16, max: 210 }), (raw, digits) => {
      const D = decimalContext(digits)
      const v = new D(raw.toPrecision(17)).div(3) // a full-length decimal
      const exact = new Ref(v.toString()).exp()
      const relative = new Ref(exp(v).toString()).minus(exact).abs().div(exact)
      const bound = new Ref(10).pow(1 - digits).times(v.abs().lt(0.5) ? '0.51' : '1.51')
      expect(relative.lte(bound)).toBe(true)
    }), { numRuns: 400, examples: [[6.04061564513742, 155]] }) // about 4 units in the last place: e^2 = 7.39 times e^0.0135 = 1.01
  })

  it('on the remainder, equals decimal.js\'s correctly rounded exp in practically every case', () => {
    let differ = 0
    fc.assert(fc.property(fc.double({ min: -0.5, max: 0.5, noNaN: true }), fc.integer({ min: 16, max: 210 }), (raw, digits) => {
      const D = decimalContext(digits)
      const r = new D(raw.toPrecision(17)).div(3)
      if (exp(r).toString() !== r.exp().toString()) differ += 1
    }), { numRuns: 1000 })
    expect(differ).toBeLessThanOrEqual(1)
  })
})
