// Two-way (tensor-product) fill against SciPy (tests/reference/fill2d_reference.py; the SciPy call named beside each
// result): RectBivariateSpline(kx=3, ky=3, s=0) and RegularGridInterpolator(method='cubic', solver=spsolve) for not-a-knot on
// both axes, RegularGridInterpolator 'linear' and 'pchip' (axes as (d, x), so that x is filled first, as the engine does),
// and successive SciPy 1-D fits for a method per axis.
import { describe, expect, it } from 'vitest'
import { fill2d, type Fill2DRequest, type MethodId, type TransformId } from '~~/server/engine'
import { T, engineErrorOf } from './helpers'
import { loadReference } from './reference'

interface Fixture {
  scipy: string
  datasets: { name: string, x: string[], d: string[], z: string[][], gridX: string[], gridD: string[], results: { method: MethodId | { x: MethodId, d: MethodId }, transform: TransformId, scipy: string, values: string[] }[] }[]
}

const fixture = loadReference<Fixture>('fill2d_reference.py', 'fill2d-fixture.json', 'Two-way SciPy reference')

const REL = new T('1e-12')
const ABS = new T('1e-14')

function knotsOf(ds: Fixture['datasets'][number]) {
  return ds.x.flatMap((x, i) => ds.d.map((d, j) => ({ x, d, y: ds.z[i]![j]! })))
}

describe('fill2d against SciPy (tensor product)', () => {
  for (const ds of fixture.datasets) {
    for (const ref of ds.results) {
      const method = typeof ref.method === 'string' ? ref.method : { x: { method: ref.method.x }, d: { method: ref.method.d } }
      it(`${ds.name}: ${JSON.stringify(ref.method)} on ${ref.transform} vs ${ref.scipy}`, () => {
        const r = fill2d({ knots: knotsOf(ds), method, transform: ref.transform, grid: { x: ds.gridX, d: ds.gridD } })
        expect(r.points).toHaveLength(ref.values.length)
        expect(r.diagnostics.knotsReproduced).toBe(true)
        r.points.forEach((p, k) => {
          const d = new T(p.y).minus(ref.values[k]!).abs()
          if (d.gt(T.max(new T(ref.values[k]!).abs().times(REL), ABS))) expect.fail(`x = ${p.x}, d = ${p.d}: engine ${p.y}, SciPy ${ref.values[k]}`)
        })
      })
    }
  }
})

describe('fill2d requests', () => {
  const ds = fixture.datasets[0]!
  const base: Fill2DRequest = { knots: knotsOf(ds), method: 'pchip', grid: { x: { from: '20', to: '60', step: '10' }, d: ['0', '5'] } }

  it('grids on each axis (a regular grid or a list), or a list of pairs in the caller\'s order, give the same values', () => {
    const onGrid = fill2d(base)
    expect(onGrid.points.map(p => `${p.x}|${p.d}`)).toEqual(['20|0', '20|5', '30|0', '30|5', '40|0', '40|5', '50|0', '50|5', '60|0', '60|5'])
    const pairs = [...onGrid.points].reverse().map(p => ({ x: p.x, d: p.d }))
    const listed = fill2d({ ...base, grid: undefined, at: pairs })
    expect(listed.points).toEqual([...onGrid.points].reverse())
    expect(listed.spec.at).toEqual(pairs)
    expect(onGrid.spec.grid).toEqual({ x: { from: '20', to: '60', step: '10' }, d: ['0', '5'] })
    expect(onGrid.spec.methods).toEqual({ x: { method: 'pchip', options: {} }, d: { method: 'pchip', options: {} } })
  })

  it('fills an affine method along d by one set of weights (on a grid) with the same digits as line by line (pairs)', () => {
    for (const [method, options] of [['cubic-not-a-knot', {}], ['cubic-clamped', { startSlope: '0.0002', endSlope: '-0.001' }], ['quadratic', { condition: 'right-slope', slope: '0.0003' }]] as const) {
      const request: Fill2DRequest = { ...base, method, options, grid: { x: ['21', '33.3', '59'], d: ['0.2', '1', '2.5', '4.75'] } }
      const onGrid = fill2d(request)
      const pairs = fill2d({ ...request, grid: undefined, at: onGrid.points.map(p => ({ x: p.x, d: p.d })) })
      expect(pairs.points, method).toEqual(onGrid.points)
    }
  })

  it('fills PCHIP and Akima along d by weights on values and slopes (many rows) with the same digits as line by line', () => {
    const lastD = ds.d[ds.d.length - 1]!
    for (const method of ['pchip', 'akima'] as const) {
      for (const extrapolation of ['error', 'flat', 'linear'] as const) {
        const d = [ds.d[0]!, String((Number(ds.d[0]) + Number(ds.d[1])) / 2), lastD, ...(extrapolation === 'error' ? [] : [String(Number(lastD) + 1.5)])]
        const request: Fill2DRequest = { ...base, method: { x: { method: 'cubic-natural' }, d: { method } }, extrapolation, grid: { x: { from: '20', to: '60', step: '0.5' }, d } }
        const onGrid = fill2d(request)
        const pairs = fill2d({ ...request, grid: undefined, at: onGrid.points.map(p => ({ x: p.x, d: p.d })) })
        expect(pairs.points, `${method} ${extrapolation}`).toEqual(onGrid.points)
      }
    }
  })

  it('refuses knots that do not fill a rectangular grid, naming what is missing or doubled', () => {
    const missing = base.knots.filter(k => !(k.x === '37' && k.d === '2'))
    expect(engineErrorOf(() => fill2d({ ...base, knots: missing })).message)
      .toBe('The knots do not fill a rectangular grid: there is no value at x = 37, d = 2 (7 values of x and 5 of d need 35 points; 34 were given).')
    const twice = [...base.knots, { x: '37.0', d: '2', y: '0.001' }]
    expect(engineErrorOf(() => fill2d({ ...base, knots: twice })).message).toBe('Points 18 and 36 both give x = 37, d = 2; each pair may appear once.')
  })

  it('refuses points outside the given range under error, curve methods, and transforms that depend on the term', () => {
    expect(engineErrorOf(() => fill2d({ ...base, grid: { x: ['19', '20'], d: ['0'] } })).message)
      .toBe("x = 19 lies outside the given x [20, 60] and extrapolation is 'error'; choose 'flat' or 'linear' extrapolation, or keep the points inside.")
    expect(engineErrorOf(() => fill2d({ ...base, method: 'smith-wilson' })).message).toBe('Method smith-wilson fills a curve of one variable and is not offered for two-way fills.')
    expect(engineErrorOf(() => fill2d({ ...base, transform: 'log-discount' })).code).toBe('invalid-request')
    expect(() => fill2d({ ...base, extrapolation: 'flat', grid: { x: ['19', '61'], d: ['-1', '6'] } })).not.toThrow()
  })
})
