// Select-and-ultimate fills of two-way tables (issue 17): the filled table and the money along the select-then-ultimate
// path against SciPy (tests/reference/select_reference.py: CubicSpline natural along x, numpy.interp along d), the
// annuity of a constant rate against the closed form of a geometric series, and the checks on tables made to fail them.
import { describe, expect, it } from 'vitest'
import { compareSelect, fillSelect, type SelectCell } from '~~/server/engine'
import { T } from './helpers'
import { loadReference } from './reference'

interface Fixture { xs: string[], ds: string[], z: string[][], ult: string[], select: string[][], ultimate: string[], annuity40: string, expectation40: string }
const ref = loadReference<Fixture>('select_reference.py', 'select-fixture.json', 'Select table SciPy reference')

const cellsOf = (f: Fixture): SelectCell[] => [
  ...f.xs.flatMap((x, i) => f.ds.map((d, j) => ({ x, d, y: f.z[i]![j]! }))),
  ...f.xs.map((x, i) => ({ x, d: null, y: f.ult[i]! })),
]
const close = (a: string, b: string, rel = '1e-12') => new T(a).minus(b).abs().lte(T.max(new T(b).abs().times(rel), new T('1e-16')))

describe('fillSelect against SciPy', () => {
  const r = fillSelect({
    cells: cellsOf(ref), kind: 'mortality', precision: 30,
    method: { x: { method: 'cubic-natural' }, d: { method: 'linear' } },
    grid: { x: { from: '20', to: '60', step: '1' }, d: { from: '0', to: '4', step: '1' } },
    money: { ages: [40], interest: '0.03' },
  })

  it('fills the select block (natural cubic along x, then linear along d) and the ultimate column as SciPy does', () => {
    expect(r.points).toHaveLength(41 * 5 + 41)
    for (const p of r.points) {
      const k = Number(p.x) - 20
      const want = p.d === null ? ref.ultimate[k]! : ref.select[k]![Number(p.d)]!
      if (!close(p.y, want)) expect.fail(`row ${p.x}, column ${p.d ?? 'ultimate'}: engine ${p.y}, SciPy ${want}`)
    }
    expect(r.spec.selectPeriod).toBe(5)
    expect(r.spec.select.methods).toMatchObject({ x: { method: 'cubic-natural' }, d: { method: 'linear' } })
    expect(r.spec.ultimate?.method).toBe('cubic-natural')
  })

  it('the annuity-due and expectation of a life entering at 40 along the select-then-ultimate path match the float sums', () => {
    const f = r.money.figures[0]!
    expect(f.age).toBe(40)
    expect(close(f.selectAnnuity!, ref.annuity40, '1e-12')).toBe(true)
    expect(close(f.selectExpectation!, ref.expectation40, '1e-12')).toBe(true)
    // the ultimate-only annuity at 40 starts in row 35 (attained age 35 + 5) and, with higher rates, is smaller
    expect(new T(f.ultimateAnnuity!).lt(f.selectAnnuity!)).toBe(true)
  })
})

describe('money of a constant rate', () => {
  it('equals the geometric series (1 - (vp)^(L+1)) / (1 - vp) over a path of L rates (hand-computable)', () => {
    const q = '0.01'
    const rows = ['60', '61', '62', '63']
    const cells: SelectCell[] = rows.flatMap(x => [{ x, d: '0', y: q }, { x, d: '1', y: q }, { x, d: null, y: q }])
    const r = fillSelect({ cells, kind: 'mortality', method: { x: { method: 'linear' }, d: { method: 'linear' } }, grid: { x: rows, d: ['0', '1'] }, money: { ages: [60, 62], interest: '0.05' } })
    const vp = new T('0.99').div('1.05')
    // entry at 60: 2 select rates, then the ultimate column of rows 60..63 (4 rates): L = 6; at 62: 2 + 2 = 4
    for (const [age, L] of [[60, 6], [62, 4]] as const) {
      const f = r.money.figures.find(g => g.age === age)!
      const series = new T(1).minus(vp.pow(L + 1)).div(new T(1).minus(vp))
      expect(new T(f.selectAnnuity!).minus(series).abs().lt('1e-30')).toBe(true)
    }
    expect(r.checks.every(c => c.passed !== false)).toBe(true)
  })
})

describe('checks of a select table', () => {
  const rows = ['30', '31', '32', '33', '34', '35']
  const base = (x: string, d: number) => new T('0.001').plus(new T(x).minus(30).times('0.0001')).plus(d * 0.0002)
  const table = (edit: (x: string, d: string | null, y: InstanceType<typeof T>) => InstanceType<typeof T>): SelectCell[] => rows.flatMap(x => [
    ...[0, 1].map(d => ({ x, d: String(d), y: edit(x, String(d), base(x, d)).toString() })),
    { x, d: null, y: edit(x, null, base(x, 3)).toString() },
  ])
  const run = (cells: SelectCell[], kind: 'mortality' | 'lapse' = 'mortality') => fillSelect({ cells, kind, method: { x: { method: 'linear' }, d: { method: 'linear' } }, grid: { x: rows, d: ['0', '1'] } })
  const check = (cells: SelectCell[], key: string) => run(cells).checks.find(c => c.key === key)!

  it('pass on a table that rises with age and duration, the select rates below the ultimate', () => {
    expect(run(table((_x, _d, y) => y)).checks.map(c => [c.key, c.passed])).toEqual([
      ['select-below-ultimate', true], ['rising-with-duration', true], ['smooth-rows', true], ['smooth-columns', true], ['select-ratio', true],
    ])
  })

  it('name the cell where a select rate passes the ultimate rate at the same attained age', () => {
    // row 33 duration 1 is attained age 34, whose ultimate rate is in row 32 (select period 2)
    const c = check(table((x, d, y) => (x === '33' && d === '1' ? new T('0.01') : y)), 'select-below-ultimate')
    expect(c.passed).toBe(false)
    expect(c.cells).toContain('33/1')
  })

  it('name a row where the rate falls with duration, and a zig-zag down a column', () => {
    const falling = check(table((x, d, y) => (x === '31' && d === '1' ? new T('0.0009') : y)), 'rising-with-duration')
    expect(falling.passed).toBe(false)
    expect(falling.cells).toContain('31/1')
    const zig = check(table((x, d, y) => (d === '0' && ['31', '33'].includes(x) ? y.plus('0.0005') : y)), 'smooth-rows')
    expect(zig.passed).toBe(false)
    expect(zig.cells).toContain('30/0')
  })

  it('say why the mortality checks are not made for a lapse table', () => {
    const c = run(table((_x, _d, y) => y), 'lapse').checks.find(k => k.key === 'select-below-ultimate')!
    expect(c.passed).toBeNull()
    expect(c.detail).toMatch(/mortality tables only/)
  })
})

describe('compareSelect', () => {
  it('measures every choice against the first: the largest absolute difference over all filled cells and where', () => {
    const request = { cells: cellsOf(ref), kind: 'mortality' as const, grid: { x: { from: '20', to: '60', step: '1' }, d: ['0', '1', '2', '3', '4'] } }
    const r = compareSelect(request, [{ x: { method: 'linear' }, d: { method: 'linear' } }, { x: { method: 'cubic-natural' }, d: { method: 'linear' }, label: 'spline rows' }])
    expect(r.differences[0]).toEqual({ label: 'linear × linear', maxAbsDiff: '0', at: null })
    const [a, b] = r.choices.map(c => c.result.points)
    let worst = new T(0)
    a!.forEach((p, k) => { const d = new T(b![k]!.y).minus(p.y).abs(); if (d.gt(worst)) worst = d })
    expect(r.differences[1]!.label).toBe('spline rows')
    expect(new T(r.differences[1]!.maxAbsDiff).eq(worst)).toBe(true)
    expect(worst.gt(0)).toBe(true)
  })
})
