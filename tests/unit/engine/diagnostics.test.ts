// Diagnostics and comparison. Sources: the quadratic spline's zig-zag and its dependence on the end condition
// (docs/methods.md, quadratic spline; Chapra, quadratic splines); roughness as sums of squared differences (Whittaker 1923);
// forward rates from discount factors (Hull, Options, Futures and Other Derivatives, ch. 4).
import { describe, expect, it } from 'vitest'
import { compare, fill, METHODS, ENGINE_VERSION } from '~~/server/engine'
import { knots } from './helpers'

const abridged = knots([20, 25, 30, 35, 40, 45, 50, 55, 60], ['0.00060', '0.00065', '0.00075', '0.00095', '0.00125', '0.00175', '0.00260', '0.00400', '0.00640'])
const grid = { from: '20', to: '60', step: '1' }

describe('diagnostics', () => {
  it('shows the quadratic spline zig-zag, and that it depends on which end carries the extra condition', () => {
    const left = fill({ knots: abridged, method: 'quadratic', grid, kind: 'mortality' })
    const right = fill({ knots: abridged, method: 'quadratic', options: { condition: 'right-zero-curvature' }, grid, kind: 'mortality' })
    const pchip = fill({ knots: abridged, method: 'pchip', grid, kind: 'mortality' })
    expect(left.diagnostics.curvatureSignChanges.count).toBe(0)
    expect(right.diagnostics.curvatureSignChanges.count).toBeGreaterThanOrEqual(4)
    expect(right.diagnostics.monotonicity.knotDirection).toBe('increasing')
    expect(right.diagnostics.monotonicity.fillTurningPoints).toBeGreaterThanOrEqual(4)
    expect(pchip.diagnostics.monotonicity.fillTurningPoints).toBe(0)
    expect(Number(right.diagnostics.roughness.secondDifferences)).toBeGreaterThan(Number(pchip.diagnostics.roughness.secondDifferences))
  })

  it('flags values out of range for the kind', () => {
    const r = fill({ knots: knots([0, 1, 2, 3], ['0', '0.9', '1', '0.2']), method: 'cubic-natural', grid: { from: '0', to: '3', step: '0.25' }, kind: 'lapse' })
    expect(r.diagnostics.outOfRange.count).toBeGreaterThan(0)
    expect(r.diagnostics.outOfRange.rule).toBe('0 <= rate <= 1')
    const neg = fill({ knots: knots([1, 2, 3], ['0.01', '-0.002', '0.01']), method: 'linear', grid: { from: '1', to: '3', step: '0.5' }, kind: 'spot-rate' })
    expect(neg.diagnostics.outOfRange.first).toEqual([{ x: '2', value: '-0.002' }])
  })

  it('finds negative forward rates and where (Hull, ch. 4: f = (P1/P2)^(1/dt) - 1)', () => {
    // spot rates falling fast: r(1) = 5%, r(2) = 2% -> P(1)/P(2) = 1.02^2/1.05 < 1 -> negative forward 1..2
    const r = fill({ knots: knots([1, 2, 3], ['0.05', '0.02', '0.021']), method: 'linear', grid: { from: '1', to: '3', step: '1' }, kind: 'spot-rate' })
    const f = r.diagnostics.forwards!
    expect(f.negativeCount).toBe(1)
    expect(f.negatives[0]).toEqual({ from: '1', to: '2' })
    const expected = 1.02 ** 2 / 1.05 - 1
    expect(Number(f.minimum!.value)).toBeCloseTo(expected, 14)
  })

  it('records the fully resolved spec', () => {
    const r = fill({ knots: abridged, method: 'quadratic', options: { condition: 'right-slope', slope: '0.0005' }, grid, precision: 30 })
    expect(r.spec).toMatchObject({
      engineVersion: ENGINE_VERSION, method: 'quadratic', options: { condition: 'right-slope', slope: '0.0005' },
      transform: 'none', extrapolation: 'error', grid: { from: '20', to: '60', step: '1' }, at: null,
      precision: 30, workingPrecision: 40, rounding: 'half-even', kind: 'other', knotCount: 9,
    })
    const d = fill({ knots: abridged, method: 'quadratic', grid })
    expect(d.spec.options).toEqual({ condition: 'left-zero-curvature' })
    expect(d.spec.money).toEqual({ ages: [65], interest: '0.03', annuityTerms: [10, 20], keyTerms: ['1', '2', '5', '10', '20', '30'] })
  })

  it('rounds to the stated significant digits, half-even', () => {
    const r = fill({ knots: knots([0, 1], ['0', '1']), method: 'linear', at: ['0.333333333333333333333333'], precision: 6 })
    expect(r.points[0]!.y).toBe('0.333333')
    const even = fill({ knots: knots([0, 2], ['0', '2.0000025']), method: 'linear', at: ['2'], precision: 7 })
    expect(even.points[0]!.y).toBe('2.000002') // ...25 -> ...2 (half-even)
  })

  it('lists every method with options, and a method file per registry entry', () => {
    expect(METHODS.map(m => m.id)).toEqual(['linear', 'log-linear', 'quadratic', 'cubic-natural', 'cubic-clamped', 'cubic-not-a-knot', 'pchip', 'akima', 'karup-king', 'sprague', 'beers', 'monotone-convex', 'smith-wilson'])
    expect(METHODS.find(m => m.id === 'quadratic')!.options.map(o => o.name)).toEqual(['condition', 'slope'])
    for (const m of METHODS) expect(m.source.length).toBeGreaterThan(20)
  })
})

describe('compare', () => {
  it('gives pairwise differences and money differences from the baseline', () => {
    const table = knots([50, 60, 70, 80, 90, 100, 110], ['0.0030', '0.0075', '0.0190', '0.0480', '0.1200', '0.2800', '0.5500'])
    const res = compare(
      { knots: table, method: 'linear', grid: { from: '50', to: '110', step: '1' }, kind: 'mortality', money: { ages: [65] } },
      [{ method: 'pchip', transform: 'log' }, { method: 'linear' }, { method: 'quadratic' }, { method: 'log-linear', transform: 'logit' }],
    )
    expect(res.baseline).toBe('pchip on log')
    expect(res.entries.map(e => e.label)).toEqual(['pchip on log', 'linear', 'quadratic', 'log-linear on logit'])
    const failed = res.entries[3]!
    expect(failed.ok).toBe(false)
    expect(res.pairs).toHaveLength(3)
    const pair = res.pairs.find(p => p.a === 'pchip on log' && p.b === 'linear')!
    expect(Number(pair.maxAbsDifference)).toBeGreaterThan(0)
    expect(pair.at).not.toBeNull()
    const e65 = res.money.find(m => m.label === 'linear' && m.key === 'e(65)')!
    // linear on q overstates q between ages where q is convex, so life expectancy falls
    expect(Number(e65.absolute)).toBeLessThan(0)
    expect(Number(e65.percent)).toBeCloseTo(100 * Number(e65.absolute) / Number(e65.baseline), 10)
  })
})
