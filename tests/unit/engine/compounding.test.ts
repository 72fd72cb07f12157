// Compounding of curve tables. Source: the conversion between compoundings, R_c = m ln(1 + R_m / m) and
// P(t) = (1 + R_m/m)^(-m t) = exp(-R_c t) (Hull, Options, Futures and Other Derivatives, ch. 4, "continuous compounding").
// A curve stated under one compounding and the same curve converted to another must give the same discount factors,
// so the same ln P(t) at every term, whatever the method: the checks below fill both and compare.
import Decimal from 'decimal.js'
import { describe, expect, it } from 'vitest'
import { fill, type Compounding, type FillRequest } from '~~/server/engine'
import { close, engineErrorOf, knots } from './helpers'

const H = Decimal.clone({ precision: 80 })
const TENORS = ['0.25', '0.5', '1', '2', '3', '5', '7', '10', '15', '20', '30']
const ANNUAL = ['0.0412', '0.0405', '0.0391', '0.0368', '0.0355', '0.0349', '0.0352', '0.0361', '0.0375', '0.0381', '0.0372']

/** The annual rate r as a rate under c with the same discount factor (Hull, ch. 4), to 45 digits. */
function convert(r: string, c: Compounding): string {
  const Rc = new H(r).plus(1).ln()
  const v = c === 'continuous' ? Rc : c === 'semi-annual' ? Rc.div(2).exp().minus(1).times(2) : new H(r)
  return v.toSignificantDigits(45).toString()
}

/** ln P(t) from a rate under c (Hull, ch. 4). */
function lnP(t: string, r: string, c: Compounding): Decimal {
  const rate = new H(r)
  const F = c === 'continuous' ? rate : c === 'semi-annual' ? rate.div(2).plus(1).ln().times(2) : rate.plus(1).ln()
  return F.times(t).neg()
}

const grid = { from: '0', to: '30', step: '0.25' }

describe('compounding of curve tables (source: Hull, ch. 4, conversion between compoundings)', () => {
  for (const c of ['continuous', 'semi-annual'] as const) {
    for (const method of ['linear', 'cubic-natural', 'pchip'] as const) {
      it(`${method} on log-discount: the curve stated ${c} gives the same ln P(t) as the annual curve`, () => {
        const annual = fill({ knots: knots(TENORS, ANNUAL), method, transform: 'log-discount', grid, kind: 'spot-rate' })
        const other = fill({ knots: knots(TENORS, ANNUAL.map(r => convert(r, c))), method, transform: 'log-discount', grid, kind: 'spot-rate', compounding: c })
        expect(other.spec.compounding).toBe(c)
        expect(other.diagnostics.knotsReproduced).toBe(true)
        other.points.forEach((p, k) => {
          if (p.x === '0') return
          const a = lnP(p.x, annual.points[k]!.y, 'annual')
          const b = lnP(p.x, p.y, c)
          expect(close(b.toString(), a.toString(), '1e-36', '1e-38'), `t = ${p.x}`).toBe(true)
        })
      })
    }
  }

  it('annual is the default: stating it changes no digit, and the spec records it for curve kinds only', () => {
    const base: FillRequest = { knots: knots(TENORS, ANNUAL), method: 'cubic-natural', transform: 'log-discount', grid, kind: 'spot-rate' }
    const implicit = fill(base)
    const stated = fill({ ...base, compounding: 'annual' })
    expect(stated.points).toEqual(implicit.points)
    expect(stated.diagnostics).toEqual(implicit.diagnostics)
    expect(stated.money).toEqual(implicit.money)
    expect(implicit.spec.compounding).toBe('annual')
    const mortality = fill({ knots: knots([20, 30, 40], ['0.001', '0.002', '0.004']), method: 'linear', grid: { from: '20', to: '40', step: '1' }, kind: 'mortality' })
    expect(mortality.spec.compounding).toBeUndefined()
  })

  it('a flat continuous curve has flat continuous forwards and P(t) = exp(-r t) in the money view (closed form)', () => {
    const r = new H('0.03')
    const res = fill({ knots: knots(['1', '5', '10', '30'], ['0.03', '0.03', '0.03', '0.03']), method: 'cubic-natural', transform: 'log-discount', grid: { from: '0', to: '30', step: '0.5' }, kind: 'spot-rate', compounding: 'continuous', money: { annuityTerms: [10], keyTerms: ['1', '10'] } })
    expect(res.diagnostics.forwards!.convention).toContain('continuous compounding')
    expect(close(res.diagnostics.forwards!.minimum!.value, '0.03', '1e-36', '1e-38')).toBe(true)
    const P10 = res.money.figures.find(f => f.key === 'P(10)')!.value!
    expect(close(P10, r.times(-10).exp().toString(), '1e-36', '0')).toBe(true)
    // level annuity in arrears: sum_{k=1}^{10} e^{-rk} = e^{-r} (1 - e^{-10r}) / (1 - e^{-r})
    const v = r.neg().exp()
    const pv = v.times(new H(1).minus(v.pow(10))).div(new H(1).minus(v))
    expect(close(res.money.figures.find(f => f.key === 'annuity(10)')!.value!, pv.toString(), '1e-36', '0')).toBe(true)
    expect(res.money.figures.find(f => f.key === 'fwd(1,10)')!.label).toContain('continuous compounding')
    expect(close(res.money.figures.find(f => f.key === 'fwd(1,10)')!.value!, '0.03', '1e-36', '1e-38')).toBe(true)
  })

  it('semi-annual forwards are quoted semi-annually: a flat semi-annual curve has forwards equal to its rate', () => {
    const res = fill({ knots: knots(['1', '5', '10'], ['0.04', '0.04', '0.04']), method: 'linear', transform: 'log-discount', grid: { from: '1', to: '10', step: '0.5' }, kind: 'spot-rate', compounding: 'semi-annual' })
    expect(close(res.diagnostics.forwards!.minimum!.value, '0.04', '1e-36', '1e-38')).toBe(true)
    expect(res.diagnostics.forwards!.negativeCount).toBe(0)
  })

  it('refuses an unknown compounding, and any but annual on a table that is not a curve', () => {
    const base: FillRequest = { knots: knots([1, 2, 3], ['0.01', '0.02', '0.03']), method: 'linear', grid: { from: '1', to: '3', step: '1' } }
    expect(engineErrorOf({ ...base, kind: 'spot-rate', compounding: 'quarterly' as Compounding }).message).toBe("Unknown compounding 'quarterly'; choose one of annual, continuous, semi-annual.")
    const e = engineErrorOf({ ...base, kind: 'mortality', compounding: 'continuous' })
    expect(e.message).toBe("Compounding applies to spot-rate and discount-factor tables only; this table's kind is 'mortality'.")
    expect(() => fill({ ...base, kind: 'mortality', compounding: 'annual' })).not.toThrow()
  })

  it('checks each rate against its compounding: r > -2 passes semi-annually, not annually', () => {
    const k = knots(['1', '2'], ['-1.5', '0.01'])
    expect(engineErrorOf({ knots: k, method: 'linear', transform: 'log-discount', at: ['1.5'], kind: 'spot-rate' }).message).toContain('t >= 0 and r > -1')
    expect(() => fill({ knots: k, method: 'linear', transform: 'log-discount', at: ['1.5'], kind: 'spot-rate', compounding: 'semi-annual' })).not.toThrow()
  })
})
