// Transforms: forward then inverse returns the value at the stated precision, and every knot is reproduced through
// the transform. Closed forms: logit^-1(logit q) = q, 1 - exp(ln(1 - q)) = q, exp(-(-t ln(1 + r))/t) - 1 = r (algebra).
import { describe, expect, it } from 'vitest'
import { fill, type MethodId, type TransformId } from '~~/server/engine'
import { decimalContext, exp, roundTo } from '~~/server/engine/decimal'
import { TRANSFORMS } from '~~/server/engine/transforms'
import { knots } from './helpers'

const METHODS: MethodId[] = ['linear', 'quadratic', 'cubic-natural', 'cubic-clamped', 'cubic-not-a-knot', 'pchip', 'akima']

describe('transforms', () => {
  const D = decimalContext(50)
  const samples: Record<TransformId, [string, string][]> = {
    'none': [['1', '-3.25'], ['2', '0']],
    'log': [['20', '0.000512'], ['100', '0.99'], ['1', '123456.789']],
    'logit': [['20', '0.000512'], ['100', '0.999999'], ['50', '0.5']],
    'cumulative-hazard': [['20', '0'], ['20', '0.000512'], ['110', '0.999']],
    'log-discount': [['0.25', '0.0412'], ['30', '-0.0049'], ['10', '0.25']],
  }
  for (const [id, pairs] of Object.entries(samples) as [TransformId, [string, string][]][]) {
    it(`${id}: inverse(forward(y)) = y at 40 digits`, () => {
      const t = TRANSFORMS[id]
      for (const [x, y] of pairs) {
        const v = t.forward(new D(x), new D(y))
        expect(roundTo(t.inverse(new D(x), v), 40).toString()).toBe(new D(y).toString())
      }
    })
  }

  it('split exp e^n e^(v-n) agrees with decimal.js exp to the working precision and is deterministic (e^(a+b) = e^a e^b)', () => {
    for (const raw of ['-9.87654321', '-5.5', '-0.4999', '0', '0.3', '2.5', '7.000001', '-123.456']) {
      const v = new D(raw).plus('1.234567890123456789012345678901234567890123e-7')
      const direct = v.exp()
      const first = exp(v)
      expect(first.minus(direct).div(direct).abs().lt('1e-47'), raw).toBe(true)
      expect(exp(v).eq(first)).toBe(true)
    }
  })

  const mortality = knots([20, 30, 40, 50, 60, 70, 80, 90, 100], ['0.000592', '0.000753', '0.001163', '0.002322', '0.005859', '0.016698', '0.049295', '0.140216', '0.355115'])
  for (const transform of ['log', 'logit', 'cumulative-hazard'] as TransformId[]) {
    for (const method of METHODS) {
      it(`${method} on ${transform} reproduces every knot exactly`, () => {
        const r = fill({ knots: mortality, method, transform, grid: { from: '20', to: '100', step: '1' }, kind: 'mortality' })
        expect(r.diagnostics.maxKnotDeviation).toBe('0')
        for (const k of mortality) expect(r.points.find(p => p.x === k.x)!.y).toBe(k.y)
      })
    }
  }

  const curve = knots(['0.25', '0.5', '1', '2', '3', '5', '7', '10', '15', '20', '30'], ['0.0412', '0.0405', '0.0391', '0.0368', '0.0355', '0.0349', '0.0352', '0.0361', '0.0375', '0.0381', '0.0372'])
  it('log-discount reproduces the knots, anchors P(0) = 1 and gives r(0) as the limit', () => {
    const r = fill({ knots: curve, method: 'cubic-natural', transform: 'log-discount', grid: { from: '0', to: '30', step: '0.25' }, kind: 'spot-rate' })
    expect(r.diagnostics.maxKnotDeviation).toBe('0')
    expect(r.diagnostics.notes[0]).toContain('t = 0')
    const r0 = Number(r.points[0]!.y)
    expect(r0).toBeGreaterThan(0.04) // short end continues the inverted curve
    expect(r0).toBeLessThan(0.045)
  })
  it('log-discount with a knot at t = 0 returns that rate there', () => {
    const withZero = [{ x: '0', y: '0.0420' }, ...curve]
    const r = fill({ knots: withZero, method: 'pchip', transform: 'log-discount', at: ['0', '0.25', '0.1'], kind: 'spot-rate' })
    expect(r.points[0]!.y).toBe('0.042')
    expect(r.points[1]!.y).toBe('0.0412')
  })
  it('log-linear on discount factors gives flat forwards between tenors (Hagan and West 2006, raw interpolation)', () => {
    const dfs = knots(['1', '2', '5'], ['0.97', '0.93', '0.85'])
    const r = fill({ knots: dfs, method: 'log-linear', grid: { from: '1', to: '5', step: '0.5' }, kind: 'discount-factor' })
    // forward between 2 and 5: (0.93/0.85)^(1/3) - 1, the same on every sub-interval
    const f = r.diagnostics.forwards!
    expect(f.negativeCount).toBe(0)
    expect(Number(f.minimum!.value)).toBeCloseTo(Math.pow(0.93 / 0.85, 1 / 3) - 1, 12)
  })
})
