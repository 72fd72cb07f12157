// Money-free summaries of lapse and salary tables against closed forms (source: closed form).
// Constant lapse rate w over policy years 1..n: in force after n years of 1,000 = 1000 (1 - w)^n (single decrement,
// Dickson, Hardy and Waters, AMLCR, multiple decrement models). A salary scale s_x = g^(x - 20): s_65 / s_20 = g^45 and the
// average yearly growth (s_65 / s_20)^(1/45) - 1 = g - 1 exactly (the salary scale ratio of AMLCR's pension chapter).
import Decimal from 'decimal.js'
import { describe, expect, it } from 'vitest'
import { fill } from '~~/server/engine'
import { close, knots } from './helpers'

const H = Decimal.clone({ precision: 60 })
const value = (r: ReturnType<typeof fill>, key: string) => r.money.figures.find(f => f.key === key)?.value ?? null

describe('lapse tables: policies still in force (source: closed form)', () => {
  it('a constant rate of 8 % leaves 1000 x 0.92^n policies after n years', () => {
    const r = fill({ knots: knots([1, 5, 10, 20], ['0.08', '0.08', '0.08', '0.08']), method: 'linear', grid: { from: '1', to: '20', step: '1' }, kind: 'lapse' })
    expect(r.money.basis).toBe('persistency')
    for (const n of [1, 5, 10, 20]) expect(close(value(r, `in-force(${n})`)!, new H('0.92').pow(n).times(1000).toString(), '1e-35', '0')).toBe(true)
  })

  it('a grid without whole policy years says why there is no summary', () => {
    const r = fill({ knots: knots([1, 5], ['0.1', '0.05']), method: 'linear', at: ['1.5', '2.5'], kind: 'lapse' })
    expect(r.money.available).toBe(false)
    expect(r.money.reason).toMatch(/whole-year grid/)
  })
})

describe('salary scales: growth (source: closed form)', () => {
  it('s_x = 1.025^(x - 20) grows by 2.5 % a year and by 1.025^45 from 20 to 65', () => {
    const ages = [20, 30, 40, 50, 65]
    const r = fill({ knots: knots(ages, ages.map(a => new H('1.025').pow(a - 20).toString())), method: 'linear', transform: 'log', grid: { from: '20', to: '65', step: '1' }, kind: 'salary' })
    expect(r.money.basis).toBe('salary')
    expect(close(value(r, 'growth')!, new H('1.025').pow(45).toString(), '1e-30', '0')).toBe(true)
    expect(close(value(r, 'yearly')!, '0.025', '0', '1e-30')).toBe(true)
    expect(close(value(r, 'decade')!, new H('1.025').pow(10).toString(), '1e-30', '0')).toBe(true)
  })
})
