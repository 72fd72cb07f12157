// Two-way tables (issue 17, part 1): made with their given cells, read back in order as exact decimals, saved under the
// optimistic lock with the content hash the database computes too, audited; frozen when signed off; a fill fitted on
// other cells cannot be submitted (the deferred trigger of migration 0701 as extended by 1201).
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { QueryTypes } from 'sequelize'
import { gridContentHash } from '~~/server/lib/points-hash'
import type { CellDto, TableDto, VersionDto } from '#shared/types/tables'
import { Client, DEMO, FENWICK, LARKSPUR, closeOwnerDb, count, ownerDb, signedIn } from './helpers'

afterAll(closeOwnerDb)
let analyst: Client
beforeAll(async () => { analyst = await signedIn(DEMO.analyst) })

// a small select table: entry ages 30, 40, 50 by durations 0, 1 and the ultimate column (values invented for the test)
const CELLS: CellDto[] = [
  { x: '40', d: '1', y: '0.0012' }, { x: '30', d: null, y: '0.0011' }, { x: '30', d: '0', y: '0.0005' }, { x: '30', d: '1', y: '0.0007' },
  { x: '40', d: '0', y: '0.0009' }, { x: '40', d: null, y: '0.0021' }, { x: '50', d: '0', y: '0.002' }, { x: '50', d: '1.0', y: '0.0029' }, { x: '50', d: null, y: '0.0046' },
]
const create = (name: string, extra: Record<string, unknown> = {}) => analyst.post<TableDto & { data?: { code: string } }>(`/api/orgs/${LARKSPUR}/tables/two-way`,
  { name, kind: 'mortality', axis: 'age', colAxis: 'duration', hasUltimate: true, valueUnit: 'per-mille', cells: CELLS, ...extra })
const unique = () => `Select test ${Math.random().toString(36).slice(2, 8)}`

describe('a two-way table', () => {
  it('is created with working draft 1, its cells sorted by row then column (ultimate last), its hash the one PostgreSQL computes', async () => {
    const made = await create(unique())
    expect(made.status).toBe(201)
    expect(made.body).toMatchObject({ shape: 'two-way', colAxis: 'duration', colAxisUnit: 'years', hasUltimate: true, axis: 'age' })
    expect(made.body.versions).toEqual([expect.objectContaining({ number: 1, status: 'draft', pointCount: 9 })])
    const v = (await analyst.get<VersionDto>(`/api/orgs/${LARKSPUR}/tables/${made.body.id}/versions/1`)).body
    expect(v.points).toEqual([])
    expect(v.cells.map(c => `${c.x}/${c.d ?? 'ult'}`)).toEqual(['30/0', '30/1', '30/ult', '40/0', '40/1', '40/ult', '50/0', '50/1', '50/ult'])
    expect(v.cells.find(c => c.x === '50' && c.d === '1')!.y).toBe('0.0029')
    expect(v.contentHash).toBe(gridContentHash(CELLS))
    const [db] = await ownerDb().query<{ h: string }>('SELECT kw_points_hash(:id) AS h', { replacements: { id: v.id }, type: QueryTypes.SELECT })
    expect(db!.h).toBe(v.contentHash)
    expect(await count(`SELECT 1 FROM audit_events WHERE action = 'table.create' AND object_id = :id AND detail->>'shape' = 'two-way'`, { id: made.body.id })).toBe(1)
    // another organisation cannot see it
    const outsider = await signedIn(DEMO.otherAdmin)
    expect((await outsider.get(`/api/orgs/${FENWICK}/tables/${made.body.id}`)).status).toBe(404)
  })

  it('refuses an ultimate cell without an ultimate column, a cell given twice, a probability above 1, and a taken name', async () => {
    expect((await create(unique(), { hasUltimate: false })).status).toBe(400)
    expect((await create(unique(), { cells: [...CELLS, { x: '30.0', d: '0', y: '0.0005' }] })).status).toBe(400)
    const high = await create(unique(), { cells: [{ x: '30', d: '0', y: '1.5' }] })
    expect(high.status).toBe(400)
    const name = unique()
    expect((await create(name)).status).toBe(201)
    expect((await create(name)).status).toBe(409)
  })

  it('saves cells under the lock (a stale lock gets 409 draft-conflict), audited; one-way points are refused (409 wrong-shape)', async () => {
    const made = await create(unique())
    const url = `/api/orgs/${LARKSPUR}/tables/${made.body.id}/versions/1`
    const v = (await analyst.get<VersionDto>(url)).body
    const cells = [...v.cells, { x: '60', d: '0', y: '0.0035' }]
    const saved = await analyst.req<VersionDto>('PUT', `${url}/cells`, { lockVersion: v.lockVersion, cells })
    expect(saved.status).toBe(200)
    expect(saved.body.cells).toHaveLength(10)
    expect(saved.body.contentHash).toBe(gridContentHash(cells))
    expect(saved.body.contentHash).not.toBe(v.contentHash)
    const stale = await analyst.req<{ data: { code: string } }>('PUT', `${url}/cells`, { lockVersion: v.lockVersion, cells: v.cells })
    expect(stale.status).toBe(409)
    expect(stale.body.data.code).toBe('draft-conflict')
    const points = await analyst.req<{ data: { code: string } }>('PUT', `${url}/points`, { lockVersion: saved.body.lockVersion, points: [{ x: '30', y: '0.001' }] })
    expect(points.status).toBe(409)
    expect(points.body.data.code).toBe('wrong-shape')
    // nor can it be graduated (the graduate step smooths one axis of crude rates)
    const actuary = await signedIn(DEMO.actuary)
    for (const step of ['graduate', 'graduated-draft']) {
      const graduated = await actuary.post<{ data: { code: string } }>(`${url}/${step}`, { order: 2, smoothing: '10', digits: 6, lockVersion: saved.body.lockVersion, rationale: 'Smoothing the select rates.' })
      expect(graduated.status, step).toBe(409)
      expect(graduated.body.data.code).toBe('wrong-shape')
    }
    expect(await count(`SELECT 1 FROM audit_events WHERE action = 'version.points.save' AND object_id = :id AND (detail->>'cells')::int = 10`, { id: v.id })).toBe(1)
  })

  it('cannot be submitted with a fill fitted on other cells, and its cells cannot change once signed off (for the owner role too)', async () => {
    const made = await create(unique())
    const url = `/api/orgs/${LARKSPUR}/tables/${made.body.id}/versions/1`
    const v = (await analyst.get<VersionDto>(url)).body
    // a fill recorded on the current cells, behind the app's back
    await ownerDb().query(`INSERT INTO version_grid_fill_points (version_id, x, d, y) SELECT version_id, x, d, y FROM version_grid_points WHERE version_id = :id;
      UPDATE table_versions SET fill_spec = '{"methods": {}}', fill_points_hash = kw_points_hash(id) WHERE id = :id`, { replacements: { id: v.id } })
    // a cell changes after the fill was recorded: the status change is refused at COMMIT
    await expect(ownerDb().transaction(async (t) => {
      await ownerDb().query(`UPDATE version_grid_points SET y = 0.0006 WHERE version_id = :id AND x = 30 AND d = 0`, { replacements: { id: v.id }, transaction: t })
      await ownerDb().query(`UPDATE table_versions SET status = 'in-review' WHERE id = :id`, { replacements: { id: v.id }, transaction: t })
    })).rejects.toThrow(/fitted on other points/)
    // on the cells it was fitted on, it goes through, and once signed off nothing changes
    await ownerDb().query(`UPDATE table_versions SET status = 'in-review' WHERE id = :id`, { replacements: { id: v.id } })
    await ownerDb().query(`UPDATE table_versions SET status = 'approved' WHERE id = :id`, { replacements: { id: v.id } })
    await expect(ownerDb().query(`UPDATE version_grid_points SET y = 0.0006 WHERE version_id = :id AND x = 30 AND d = 0`, { replacements: { id: v.id } })).rejects.toThrow(/cannot change/)
    await expect(ownerDb().query(`DELETE FROM version_grid_fill_points WHERE version_id = :id`, { replacements: { id: v.id } })).rejects.toThrow(/cannot change/)
    // a new draft from it carries the same cells
    const next = await analyst.post<VersionDto>(`/api/orgs/${LARKSPUR}/tables/${made.body.id}/versions`, { fromNumber: 1 })
    expect(next.status).toBe(201)
    expect(next.body.cells).toEqual(v.cells)
    expect(next.body.contentHash).toBe(v.contentHash)
  })
})
