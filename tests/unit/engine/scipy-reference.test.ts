// Source: SciPy scipy.interpolate (CubicSpline, PchipInterpolator, Akima1DInterpolator, make_interp_spline k=2) and numpy.interp.
// The fixture is regenerated from tests/reference/scipy_reference.py when python3 with SciPy is on PATH; otherwise the
// committed tests/reference/scipy-fixture.json is used (the test says which).
import { spawnSync } from 'node:child_process'
import { mkdtempSync, readFileSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { dirname, join, resolve } from 'node:path'
import { fileURLToPath } from 'node:url'
import { describe, expect, it } from 'vitest'
import { fill, type MethodId } from '~~/server/engine'
import { T } from './helpers'

interface Fixture {
  scipy: string
  numpy: string
  datasets: {
    name: string
    note: string
    x: string[]
    y: string[]
    at: string[]
    results: { method: MethodId, options: Record<string, string>, scipy: string, values: string[] }[]
  }[]
}

const here = dirname(fileURLToPath(import.meta.url))
const script = resolve(here, '../../reference/scipy_reference.py')
const committed = resolve(here, '../../reference/scipy-fixture.json')

function loadFixture(): { fixture: Fixture, origin: string } {
  const probe = spawnSync('python3', ['-c', 'import scipy, numpy'], { encoding: 'utf8' })
  if (probe.status === 0) {
    const out = join(mkdtempSync(join(tmpdir(), 'knotwork-scipy-')), 'scipy-fixture.json')
    const run = spawnSync('python3', [script, out], { encoding: 'utf8' })
    if (run.status === 0) return { fixture: JSON.parse(readFileSync(out, 'utf8')) as Fixture, origin: `regenerated just now (${run.stdout.trim()})` }
    console.warn(`SciPy reference script failed, using the committed fixture: ${run.stderr}`)
  }
  return { fixture: JSON.parse(readFileSync(committed, 'utf8')) as Fixture, origin: 'committed fixture (no python3 with SciPy found)' }
}

const { fixture, origin } = loadFixture()
console.info(`SciPy reference: ${origin}; SciPy ${fixture.scipy}, NumPy ${fixture.numpy}`)

// Tolerance: 1e-12 relative, or 1e-14 absolute near zero. SciPy works in binary64 (about 1e-16 relative per operation);
// the engine at 40 digits is exact by comparison, so the difference is SciPy's rounding, amplified by at most a few hundred.
const REL = new T('1e-12')
const ABS = new T('1e-14')

describe('agreement with SciPy / NumPy (source: scipy.interpolate 1.17, numpy.interp)', () => {
  it('has at least five datasets with at least 50 points each', () => {
    expect(fixture.datasets.length).toBeGreaterThanOrEqual(5)
    for (const ds of fixture.datasets) expect(ds.at.length).toBeGreaterThanOrEqual(50)
  })
  for (const ds of fixture.datasets) {
    for (const ref of ds.results) {
      const name = `${ds.name}: ${ref.method} ${JSON.stringify(ref.options)} vs ${ref.scipy}`
      it(name, () => {
        const result = fill({
          knots: ds.x.map((x, i) => ({ x, y: ds.y[i]! })),
          method: ref.method,
          options: ref.options,
          at: ds.at,
          precision: 40,
        })
        expect(result.points).toHaveLength(ref.values.length)
        let checked = 0
        result.points.forEach((p, k) => {
          const ours = new T(p.y)
          const theirs = new T(ref.values[k]!)
          const d = ours.minus(theirs).abs()
          const allowed = T.max(theirs.abs().times(REL), ABS)
          if (d.gt(allowed)) expect.fail(`${name} at x = ${p.x}: engine ${p.y}, SciPy ${ref.values[k]}`)
          checked += 1
        })
        expect(checked).toBe(ref.values.length)
      })
    }
  }
})
