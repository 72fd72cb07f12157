// Money impact against closed forms (source: closed form; Dickson, Hardy and Waters, AMLCR, 2nd ed., annuities chapter).
// Constant q: p = 1 - q, ages a..w: e_a = sum_{k=1}^{N} p^k = p (1 - p^N) / (1 - p), N = w - a;
// annuity-due = sum_{k=0}^{N} (v p)^k = (1 - (v p)^{N+1}) / (1 - v p).
// Flat spot curve r: P(k) = (1 + r)^-k; level annuity PV = (1 - (1 + r)^-N) / r; Macaulay duration
// D = (1 + r)/r - N / ((1 + r)^N - 1) (closed form; e.g. Macaulay 1938, standard fixed-income texts).
import Decimal from 'decimal.js'
import { describe, expect, it } from 'vitest'
import { fill } from '~~/server/engine'
import { close, knots } from './helpers'

const H = Decimal.clone({ precision: 60 })

function figure(r: ReturnType<typeof fill>, key: string): string {
  const f = r.money.figures.find(x => x.key === key)
  if (!f?.value) throw new Error(`no figure ${key}: ${f?.reason ?? 'missing'}`)
  return f.value
}

describe('money impact (source: closed form)', () => {
  const q = new H('0.02')
  const i = new H('0.04')
  const table = knots([50, 70, 90, 110], ['0.02', '0.02', '0.02', '0.02'])

  it('constant q gives the closed-form e_x and annuity-due', () => {
    const r = fill({ knots: table, method: 'cubic-natural', grid: { from: '50', to: '110', step: '1' }, kind: 'mortality', money: { ages: [65, 50], interest: '0.04' } })
    expect(r.money.available).toBe(true)
    const p = new H(1).minus(q)
    const vp = p.div(i.plus(1))
    for (const age of [65, 50]) {
      const N = 110 - age
      const e = p.times(new H(1).minus(p.pow(N))).div(new H(1).minus(p))
      const a = new H(1).minus(vp.pow(N + 1)).div(new H(1).minus(vp))
      expect(close(figure(r, `e(${age})`), e.toString(), '1e-35', '0')).toBe(true)
      expect(close(figure(r, `adue(${age})`), a.toString(), '1e-35', '0')).toBe(true)
    }
    expect(figure(r, 'l(50)')).toBe('100000')
  })

  it('is not available without an integer-age grid covering the ages, and says why', () => {
    const gap = fill({ knots: table, method: 'linear', at: ['50', '51', '53'], kind: 'mortality' })
    expect(gap.money.available).toBe(false)
    expect(gap.money.reason).toContain('no value at age 52')
    const off = fill({ knots: table, method: 'linear', grid: { from: '50', to: '60', step: '1' }, kind: 'mortality' })
    expect(off.money.figures.find(f => f.key === 'e(65)')!.reason).toContain('outside the filled integer ages 50..60')
    const fine = fill({ knots: table, method: 'linear', grid: { from: '50', to: '110', step: '0.5' }, kind: 'mortality' })
    expect(fine.money.available).toBe(true) // integer ages are picked out of a finer grid
  })

  it('a flat spot curve gives the closed-form annuity PV and Macaulay duration', () => {
    const r = new H('0.035')
    const curve = knots(['0.5', '1', '5', '10', '30'], ['0.035', '0.035', '0.035', '0.035', '0.035'])
    for (const transform of ['none', 'log-discount'] as const) {
      const res = fill({ knots: curve, method: 'cubic-not-a-knot', transform, grid: { from: '0.5', to: '30', step: '0.5' }, kind: 'spot-rate', money: { annuityTerms: [10, 25], keyTerms: ['1', '10'] } })
      for (const N of [10, 25]) {
        const pv = new H(1).minus(r.plus(1).pow(-N)).div(r)
        const dur = r.plus(1).div(r).minus(new H(N).div(r.plus(1).pow(N).minus(1)))
        expect(close(figure(res, `annuity(${N})`), pv.toString(), '1e-35', '0'), `${transform} PV ${N}`).toBe(true)
        expect(close(figure(res, `duration(${N})`), dur.toString(), '1e-35', '0'), `${transform} D ${N}`).toBe(true)
      }
      expect(close(figure(res, 'P(10)'), r.plus(1).pow(-10).toString(), '1e-38', '0')).toBe(true)
      expect(close(figure(res, 'fwd(1,10)'), '0.035', '1e-35', '0')).toBe(true)
      expect(res.diagnostics.forwards!.negativeCount).toBe(0)
    }
  })

  it('reports a curve figure beyond the knots as not available when extrapolation is error', () => {
    const curve = knots(['1', '5', '10'], ['0.03', '0.032', '0.034'])
    const res = fill({ knots: curve, method: 'linear', grid: { from: '1', to: '10', step: '1' }, kind: 'spot-rate', money: { annuityTerms: [20], keyTerms: ['5', '20'] } })
    expect(res.money.figures.find(f => f.key === 'P(20)')!.reason).toContain('outside the knots')
    expect(res.money.figures.find(f => f.key === 'annuity(20)')!.value).toBeNull()
    expect(res.money.figures.find(f => f.key === 'P(5)')!.value).toBe(new H('1.032').pow(-5).toSD(40).toString())
  })
})
