// Smith-Wilson, zero-coupon formulation (EIOPA, "Technical documentation of the methodology to derive EIOPA's risk-free
// interest rate term structures", Smith-Wilson chapter): the given points are reproduced, alpha is the smallest value of at
// least 0.05 (on a grid of 0.000001) for which the forward intensity at the convergence point max(LLP + 40, 60) is within
// 1 bp of ln(1 + UFR), and beyond the last liquid point the curve carries on by its own formula. No published alpha values
// or example curves are used here (none could be sourced); the point-by-point comparison with an independent NumPy
// implementation is in curve-reference.test.ts.
import { describe, expect, it } from 'vitest'
import { fill, type FillRequest } from '~~/server/engine'
import { T, engineErrorOf, knots } from './helpers'

const TERMS = ['1', '2', '3', '4', '5', '6', '7', '8', '9', '10', '12', '15', '20']
const RATES = ['0.029', '0.03', '0.0305', '0.031', '0.0315', '0.032', '0.0322', '0.0325', '0.0328', '0.033', '0.0333', '0.0335', '0.033']
const BASE: FillRequest = { knots: knots(TERMS, RATES), method: 'smith-wilson', options: { ufr: '0.0345' }, kind: 'spot-rate', extrapolation: 'method', at: TERMS }

/** Forward intensity at T from the filled annual spot rates: -(ln P(T + d) - ln P(T - d)) / 2d, ln P = -t ln(1 + r). */
function intensityFromRates(request: FillRequest, T0: string): InstanceType<typeof T> {
  const d = new T('1e-8')
  const at = [new T(T0).minus(d).toString(), new T(T0).plus(d).toString()]
  const [lo, hi] = fill({ ...request, at, precision: 50 }).points.map(p => new T(p.y).plus(1).ln().times(p.x).neg())
  return lo!.minus(hi!).div(d.times(2))
}

describe('smith-wilson (EIOPA zero-coupon formulation)', () => {
  it('reproduces every given rate exactly, with alpha calibrated or given, under any compounding', () => {
    for (const options of [{ ufr: '0.0345' }, { ufr: '0.042', alpha: '0.1' }, { ufr: '0.0345', alpha: '0.25' }] as Record<string, string>[]) {
      const r = fill({ ...BASE, options })
      expect(r.points.map(p => p.y)).toEqual(RATES.map(v => new T(v).toString()))
      expect(r.diagnostics.knotsReproduced).toBe(true)
    }
    const continuous = fill({ ...BASE, compounding: 'continuous' })
    expect(continuous.points.map(p => p.y)).toEqual(RATES.map(v => new T(v).toString()))
  })

  it('calibrates alpha: the criterion is met at it and not one grid step (0.000001) lower, checked on the filled curve', () => {
    const r = fill(BASE)
    const alpha = r.spec.options.alpha!
    expect(alpha).toBe('0.086621') // the same as the independent NumPy search (curve-reference.test.ts)
    expect(r.spec.options).toEqual({ ufr: '0.0345', alpha, llp: '20', convergencePoint: '60' })
    const omega = new T('1.0345').ln()
    const at = intensityFromRates({ ...BASE, options: { ...BASE.options, alpha } }, '60')
    const below = intensityFromRates({ ...BASE, options: { ...BASE.options, alpha: new T(alpha).minus('0.000001').toString() } }, '60')
    expect(at.minus(omega).abs().lte('0.0001')).toBe(true)
    expect(below.minus(omega).abs().gt('0.0001')).toBe(true)
    const c = r.diagnostics.convergence!
    expect(c).toMatchObject({ convergencePoint: '60', alpha, tolerance: '0.0001', met: true, below: { alpha: '0.08662', met: false } })
    expect(new T(c.forwardIntensity).minus(at).abs().lt('1e-12')).toBe(true)
  })

  it('keeps alpha at its lower bound 0.05 when that already converges', () => {
    // a flat curve at the UFR itself: every alpha converges, so the smallest allowed one is taken
    const flat = fill({ ...BASE, knots: knots(TERMS, TERMS.map(() => '0.0345')), at: ['1'] })
    expect(flat.spec.options.alpha).toBe('0.05')
    expect(flat.diagnostics.convergence!.below).toBeNull()
  })

  it('the default convergence point is max(LLP + 40, 60), and terms beyond the LLP are left out and named', () => {
    const long = fill({ ...BASE, knots: knots([...TERMS, '25', '30'], [...RATES, '0.0332', '0.0334']), at: ['1'] })
    expect(long.spec.options).toMatchObject({ llp: '30', convergencePoint: '70' })
    const cut = fill({ ...BASE, knots: knots([...TERMS, '25', '30'], [...RATES, '0.0332', '0.0334']), options: { ufr: '0.0345', llp: '20' }, at: ['1', '30'] })
    expect(cut.spec.options).toMatchObject({ llp: '20', convergencePoint: '60', alpha: '0.086621' })
    expect(cut.diagnostics.notes).toContain('smith-wilson: 2 given term(s) beyond the last liquid point 20 (25, 30) were not used.')
    expect(cut.diagnostics.knotsReproduced).toBe(false)
  })

  it('beyond the last knot it needs its own extension: the forward heads for ln(1 + UFR)', () => {
    const far = fill({ ...BASE, at: ['60', '100', '200'], precision: 30 })
    const omega = new T('1.0345').ln()
    const f200 = intensityFromRates({ ...BASE, options: { ufr: '0.0345', alpha: far.spec.options.alpha! } }, '200')
    expect(f200.minus(omega).abs().lt('0.000001')).toBe(true)
    expect(engineErrorOf({ ...BASE, extrapolation: 'error', at: ['25'] }).code).toBe('outside-knots')
    expect(engineErrorOf({ ...BASE, extrapolation: 'flat' }).message).toBe("Method smith-wilson extends itself beyond the knots; choose extrapolation 'method' to use that extension, or 'error' to keep the points inside the knots ('flat' is not offered with it).")
    expect(() => fill({ ...BASE, extrapolation: 'error', at: ['0.5', '19'] })).not.toThrow()
  })

  it('gives the same digits from its recorded spec, and carries 40 digits (the same values at precision 60, rounded)', () => {
    const at = ['0', '0.5', '7.3', '20', '45', '120']
    const first = fill({ ...BASE, at })
    const again = fill({ ...BASE, options: first.spec.options, at })
    expect(again.points).toEqual(first.points)
    const finer = fill({ ...BASE, options: first.spec.options, at, precision: 60 })
    finer.points.forEach((p, k) => expect(new T(p.y).toSignificantDigits(40).toString()).toBe(first.points[k]!.y))
  })

  it('fills discount factors on the same ln P(t) as the equivalent annual spot rates', () => {
    const factors = knots(TERMS, RATES.map((r, i) => new T(r).plus(1).pow(new T(TERMS[i]!).neg()).toSignificantDigits(45).toString()))
    const at = ['0.5', '7.5', '20', '35', '90']
    const fromRates = fill({ ...BASE, at })
    const fromFactors = fill({ ...BASE, knots: factors, kind: 'discount-factor', at })
    expect(fromFactors.spec.options.alpha).toBe(fromRates.spec.options.alpha)
    fromFactors.points.forEach((p, k) => {
      const viaRate = new T(fromRates.points[k]!.y).plus(1).ln().times(p.x).neg()
      expect(new T(p.y).ln().minus(viaRate).abs().lt('1e-37'), `t = ${p.x}`).toBe(true)
    })
  })

  it('refuses options it cannot use, saying why', () => {
    expect(engineErrorOf({ ...BASE, options: { alpha: 'fast' } }).message).toBe("Option alpha of smith-wilson: 'fast' is not a number (give a decimal string or 'auto').")
    expect(engineErrorOf({ ...BASE, options: { convergencePoint: '15' } }).message).toBe('Option convergencePoint of smith-wilson (15) must lie beyond the last liquid point 20.')
    expect(engineErrorOf({ ...BASE, options: { alpha: '0' } }).message).toBe('Option alpha of smith-wilson must be above 0 (or auto).')
    expect(engineErrorOf({ ...BASE, kind: 'lapse' }).code).toBe('not-applicable')
    // a convergence point just past the LLP on a curve far from the UFR: no alpha up to 100 gets within 1 bp there
    const e = engineErrorOf({ ...BASE, options: { ufr: '0.08', convergencePoint: '20.01' } })
    expect(e.code).toBe('calibration-failed')
    expect(e.message).toBe('No alpha up to 100 brings the forward intensity at the convergence point within 1 basis point of ln(1 + UFR); give alpha or a later convergence point.')
  })

  it('refuses, by name, a term where the fitted discount factor is not positive (it once crashed in exp)', () => {
    // rates that jump between 0.00001 % and 10 % within 0.06 years (found by the precision property test)
    const wild = knots([0, 0.01, 0.04, 0.05, 0.06, 8.46, 22.61], ['0.0000001', '0.0000001', '0.0135656', '0.0000001', '0.0999047', '0.0193966', '0.0000001'])
    const e = engineErrorOf({ knots: wild, method: 'smith-wilson', kind: 'spot-rate', at: ['1', '3', '10'] })
    expect(e.code).toBe('transform-domain')
    expect(e.message).toMatch(/^The Smith-Wilson curve through these points has a discount factor of zero or below at t = \d/)
  })
})
