// Locality of a bump (Hagan and West 2006, "Interpolation Methods for Curve Construction", Applied Mathematical Finance
// 13(2), section 2: a change to one input should change the curve only nearby). Source of the check values: SciPy
// (CubicSpline, PchipInterpolator, Akima1DInterpolator, make_interp_spline k=2) and numpy.interp, through
// tests/reference/scipy_bump.py, run now when python3 with SciPy is on PATH, else its committed output scipy-bump.json.
import { describe, expect, it } from 'vitest'
import { fill, type MethodId } from '~~/server/engine'
import { loadReference } from './reference'

type Span = { from: string, to: string, intervals: number } | null
interface BumpFixture {
  scipy: string
  datasets: { name: string, kind: 'spot-rate' | 'mortality', x: string[], y: string[], results: Record<string, { changed: Span, material: Span, ratio: number }> }[]
}

const fixture = loadReference<BumpFixture>('scipy_bump.py', 'scipy-bump.json', 'SciPy bump reference')

describe('locality of a bump, against SciPy', () => {
  for (const ds of fixture.datasets) {
    for (const [method, ref] of Object.entries(ds.results)) {
      it(`${ds.name}: ${method}`, () => {
        const r = fill({ knots: ds.x.map((x, i) => ({ x, y: ds.y[i]! })), method: method as MethodId, at: ds.x, kind: ds.kind })
        const bump = r.diagnostics.bump!
        expect(bump.changed).toEqual(ref.changed)
        expect(bump.material).toEqual(ref.material)
        expect(Math.abs(Number(bump.ratio) - ref.ratio)).toBeLessThan(1e-5 * ref.ratio)
      })
    }
  }
})

describe('locality of a bump, from the definitions', () => {
  const knots = ['1', '2', '3', '4', '5', '6', '7', '8', '9'].map(x => ({ x, y: String(Number(x) ** 2 / 100) }))
  it('linear moves exactly the two intervals next to the point, by half the bump at their middles (definition)', () => {
    const bump = fill({ knots, method: 'linear', at: ['1'] }).diagnostics.bump!
    expect(bump).toMatchObject({ at: '5', changed: { from: '4', to: '6', intervals: 2 }, ratio: '0.5' })
  })
  it('is not reported with two points, where there is no elsewhere', () => {
    expect(fill({ knots: knots.slice(0, 2), method: 'linear', at: ['1'] }).diagnostics.bump).toBeNull()
  })
})
