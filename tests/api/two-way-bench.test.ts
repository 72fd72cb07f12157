// The two-way fill bench (issue 17, part 3) and the life after it: choices of a method per axis compared side by side on
// the demo select table's cells, one chosen (values computed on the server, audited, tied to the cells), a cell changed
// afterwards makes the fill stale (submit refused), chosen again it goes for a second check and is signed off.
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { TableDto, VersionDto } from '#shared/types/tables'
import type { GridCompareDto, SavedGridFillDto } from '#shared/types/grid-fills'
import type { ReviewStateDto } from '#shared/types/review'
import { demoSelectCells } from '~~/scripts/seed/select-table'
import { Client, DEMO, LARKSPUR, closeOwnerDb, count, signedIn } from './helpers'

afterAll(closeOwnerDb)
let analyst: Client, felix: Client
let url: string
beforeAll(async () => {
  analyst = await signedIn(DEMO.analyst)
  felix = await signedIn(DEMO.both)
  const made = await analyst.post<TableDto>(`/api/orgs/${LARKSPUR}/tables/two-way`, {
    name: `Select bench ${Math.random().toString(36).slice(2, 8)}`, kind: 'mortality', axis: 'age', colAxis: 'duration', hasUltimate: true, valueUnit: 'per-mille', cells: demoSelectCells(),
  })
  expect(made.status).toBe(201)
  url = `/api/orgs/${LARKSPUR}/tables/${made.body.id}/versions/1`
})

const GRID = { x: { from: '30', to: '70', step: '1' }, d: { from: '0', to: '4', step: '1' } }
const LINEAR = { x: { method: 'linear' }, d: { method: 'linear' } }
const SPLINE = { x: { method: 'cubic-natural' }, d: { method: 'linear' } }

describe('the two-way bench', () => {
  it('compares choices side by side with the checks, the money along the select path and the largest difference', async () => {
    const r = await analyst.post<GridCompareDto>(`${url}/grid-compare`, { grid: GRID, choices: [LINEAR, SPLINE], money: { ages: [40, 60], interest: '0.03' } })
    expect(r.status).toBe(200)
    expect(r.body.caution).toMatch(/qualified actuary/)
    expect(r.body.choices.map(c => c.label)).toEqual(['linear × linear', 'cubic-natural × linear'])
    const [lin, spl] = r.body.choices.map(c => c.result)
    expect(lin!.points).toHaveLength(41 * 5 + 41)
    // the demo's invented table has select rates below ultimate and rising with duration: linear keeps both
    expect(lin!.checks.find(c => c.key === 'select-below-ultimate')!.passed).toBe(true)
    expect(lin!.checks.find(c => c.key === 'rising-with-duration')!.passed).toBe(true)
    expect(lin!.money.figures.map(f => f.age)).toEqual([40, 60])
    expect(Number(lin!.money.figures[0]!.selectAnnuity)).toBeGreaterThan(Number(lin!.money.figures[0]!.ultimateAnnuity))
    expect(spl!.spec.select.methods.x.method).toBe('cubic-natural')
    expect(r.body.differences[0]).toEqual({ label: 'linear × linear', maxAbsDiff: '0', at: null })
    expect(Number(r.body.differences[1]!.maxAbsDiff)).toBeGreaterThan(0)
    // the one-way bench refuses a two-way table
    const oneWay = await analyst.post<{ data: { code: string } }>(`${url}/fill`, { grid: { from: '30', to: '70', step: '1' }, choice: { method: 'linear' }, rationale: 'Not for a two-way table at all.', lockVersion: 0 })
    expect(oneWay.body.data.code).toBe('wrong-shape')
  })

  it('records a choice under the lock; a changed cell makes it stale; chosen again it is submitted and signed off', async () => {
    const v = (await analyst.get<VersionDto>(url)).body
    const body = { grid: GRID, choice: SPLINE, rationale: 'Smooth across entry ages, straight between durations.', money: { ages: [40] } }
    const saved = await analyst.post<SavedGridFillDto>(`${url}/grid-fill`, { ...body, lockVersion: v.lockVersion })
    expect(saved.status).toBe(200)
    expect(saved.body).toMatchObject({ cellCount: 246, stale: false, fittedOn: { contentHash: v.contentHash } })
    expect(saved.body.settings).toEqual(expect.arrayContaining([{ label: 'Method along age', value: 'Natural cubic spline' }, { label: 'Select period', value: '5 years' }]))
    expect((await analyst.post(`${url}/grid-fill`, { ...body, lockVersion: v.lockVersion })).status).toBe(409)
    const withCells = (await analyst.get<{ fill: SavedGridFillDto }>(`${url}/grid-fill?cells=1`)).body.fill
    expect(withCells.cells!.find(c => c.x === '40' && c.d === '0')!.y).toBe(v.cells.find(c => c.x === '40' && c.d === '0')!.y)
    expect(await count(`SELECT 1 FROM audit_events WHERE action = 'version.fill.save' AND object_id = :id AND detail->>'shape' = 'two-way'`, { id: v.id })).toBe(1)

    // a cell changes after the fill was chosen: submit is refused as stale
    const now = (await analyst.get<VersionDto>(url)).body
    const cells = now.cells.map(c => (c.x === '45' && c.d === '2' ? { ...c, y: '0.0011' } : c))
    expect((await analyst.req('PUT', `${url}/cells`, { lockVersion: now.lockVersion, cells })).status).toBe(200)
    const refused = await analyst.post<{ data: { code: string } }>(`${url}/submit`, {})
    expect(refused.status).toBe(409)
    expect(refused.body.data.code).toBe('fill-stale')

    const again = (await analyst.get<VersionDto>(url)).body
    expect((await analyst.post(`${url}/grid-fill`, { ...body, lockVersion: again.lockVersion })).status).toBe(200)
    expect((await analyst.post(`${url}/submit`, {})).status).toBe(200)
    expect((await felix.post<ReviewStateDto>(`${url}/approve`, {})).body.status).toBe('approved')
  })
})
