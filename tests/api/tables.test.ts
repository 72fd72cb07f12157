import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { Client, DEMO, FENWICK, LARKSPUR, closeOwnerDb, count, ownerDb, signedIn } from './helpers'
import { upload } from './import-helpers'

afterAll(closeOwnerDb)
type Version = { id: string; number: number; status: string; lockVersion: number; contentHash: string; points: { x: string; y: string }[] }
let analyst: Client
let tableUrl: string

/** A fresh mortality table with a working draft, made through the import (percent column). */
async function freshTable(client: Client): Promise<string> {
  const up = await upload(client, LARKSPUR, 'fresh.csv', 'age,q (%)\n60,1\n65,2\n70,3\n')
  const base = `/api/orgs/${LARKSPUR}/imports/${up.body.id}`
  const name = `Grid test ${Math.random().toString(36).slice(2, 8)}`
  const done = await client.post<{ tables: { id: string }[] }>(`${base}/commit`, { mapping: { sheet: 'fresh', headerRow: 0, axisColumn: 0, axis: 'age', axisUnit: 'years', columns: [{ index: 1, name, kind: 'mortality', valueUnit: 'percent' }] } })
  expect(done.status).toBe(201)
  return `/api/orgs/${LARKSPUR}/tables/${done.body.tables[0]!.id}`
}

beforeAll(async () => {
  analyst = await signedIn(DEMO.analyst)
  tableUrl = await freshTable(analyst)
})

describe('tables and versions', () => {
  it('shows the table, its versions and the points as exact decimals; other organisations get 404', async () => {
    const t = await analyst.get<{ name: string; valueUnit: string; versions: { number: number; status: string; author: { name: string }; pointCount: number }[] }>(tableUrl)
    expect(t.status).toBe(200)
    expect(t.body.valueUnit).toBe('percent')
    expect(t.body.versions).toEqual([expect.objectContaining({ number: 1, status: 'draft', pointCount: 3, author: expect.objectContaining({ name: 'Priya Raman' }) })])
    const v = await analyst.get<Version>(`${tableUrl}/versions/1`)
    expect(v.body.points).toEqual([{ x: '60', y: '0.01' }, { x: '65', y: '0.02' }, { x: '70', y: '0.03' }])
    const outsider = await signedIn(DEMO.otherAdmin)
    expect((await outsider.get(tableUrl.replace(LARKSPUR, FENWICK))).status).toBe(404)
    expect((await outsider.get(tableUrl)).status).toBe(404)
  })

  it('filters the list by kind, state and search text', async () => {
    const list = await analyst.get<{ name: string; kind: string }[]>(`/api/orgs/${LARKSPUR}/tables?kind=spot-rate`)
    expect(list.body.map(t => t.name)).toContain('Discount curve 2026-09-30')
    expect(list.body.every(t => t.kind === 'spot-rate')).toBe(true)
    const signed = await analyst.get<{ latest: { status: string } }[]>(`/api/orgs/${LARKSPUR}/tables?status=approved`)
    expect(signed.body.length).toBeGreaterThan(0)
    expect(signed.body.every(t => t.latest.status === 'approved')).toBe(true)
    const found = await analyst.get<{ name: string }[]>(`/api/orgs/${LARKSPUR}/tables?q=Pensioner`)
    expect(found.body.map(t => t.name)).toEqual(expect.arrayContaining(['Pensioner mortality, female', 'Pensioner mortality, male']))
    expect(found.body.map(t => t.name)).not.toContain('Discount curve 2026-09-30')
  })
})

describe('table details', () => {
  it('renames and re-tags a table, audited; a taken name is refused', async () => {
    const url = await freshTable(analyst)
    const name = `Renamed ${Math.random().toString(36).slice(2, 8)}`
    const r = await analyst.req<{ name: string; tags: string[]; description: string }>('PATCH', url, { name, tags: ['2026 basis', 'pensioners'], description: 'Select period excluded.' })
    expect(r.status).toBe(200)
    expect(r.body).toMatchObject({ name, tags: ['2026 basis', 'pensioners'], description: 'Select period excluded.' })
    expect(await count(`SELECT 1 FROM audit_events WHERE action = 'table.update' AND object_id = :id`, { id: url.split('/').pop() })).toBe(1)
    const taken = await analyst.req<{ statusMessage: string }>('PATCH', url, { name: 'Discount curve 2026-09-30' })
    expect(taken.status).toBe(409)
  })

  it('changes the kind or units only while every version is a working draft', async () => {
    const url = await freshTable(analyst)
    expect((await analyst.req('PATCH', url, { valueUnit: 'per-mille' })).status).toBe(200)
    const id = url.split('/').pop()
    // a version awaiting a second check carries a fill fitted on its own points (the database insists, migration 0701)
    await ownerDb().query(`INSERT INTO version_fill_points (version_id, x, y) SELECT p.version_id, p.x, p.y FROM version_points p JOIN table_versions v ON v.id = p.version_id WHERE v.table_id = :id;
      UPDATE table_versions SET fill_spec = '{"method": "linear"}', fill_points_hash = kw_points_hash(id), status = 'in-review' WHERE table_id = :id`, { replacements: { id } })
    const refused = await analyst.req<{ statusMessage: string }>('PATCH', url, { kind: 'lapse' })
    expect(refused.status).toBe(409)
    expect(refused.body.statusMessage).toMatch(/cannot change once a version/)
    expect((await analyst.req('PATCH', url, { kind: 'mortality', description: 'Same kind is fine.' })).status).toBe(200)
  })
})

describe('saving a draft', () => {
  it('saves under the lock, sorts the points, changes the hash and writes an audit event', async () => {
    const v = (await analyst.get<Version>(`${tableUrl}/versions/1`)).body
    const saved = await analyst.req<Version>('PUT', `${tableUrl}/versions/1/points`, { lockVersion: v.lockVersion, points: [{ x: '75', y: '0.045' }, ...v.points] })
    expect(saved.status).toBe(200)
    expect(saved.body.lockVersion).toBe(v.lockVersion + 1)
    expect(saved.body.points.map(p => p.x)).toEqual(['60', '65', '70', '75'])
    expect(saved.body.contentHash).not.toBe(v.contentHash)
    expect(await count(`SELECT 1 FROM audit_events WHERE action = 'version.points.save' AND object_id = :id`, { id: v.id })).toBeGreaterThan(0)
    const stale = await analyst.req<{ statusMessage: string; data: { lockVersion: number } }>('PUT', `${tableUrl}/versions/1/points`, { lockVersion: v.lockVersion, points: v.points })
    expect(stale.status).toBe(409)
    expect(stale.body.statusMessage).toContain('Someone saved this draft')
  })

  it('lets exactly one of two simultaneous saves with the same lockVersion through', async () => {
    const v = (await analyst.get<Version>(`${tableUrl}/versions/1`)).body
    const actuary = await signedIn(DEMO.actuary)
    const [a, b] = await Promise.all([
      analyst.req('PUT', `${tableUrl}/versions/1/points`, { lockVersion: v.lockVersion, points: [{ x: '60', y: '0.011' }] }),
      actuary.req('PUT', `${tableUrl}/versions/1/points`, { lockVersion: v.lockVersion, points: [{ x: '60', y: '0.012' }] }),
    ])
    expect([a.status, b.status].sort()).toEqual([200, 409])
    const after = (await analyst.get<Version>(`${tableUrl}/versions/1`)).body
    expect(after.lockVersion).toBe(v.lockVersion + 1)
  })

  it('refuses q outside [0, 1], duplicate ages, and saves by roles without tables:edit', async () => {
    const v = (await analyst.get<Version>(`${tableUrl}/versions/1`)).body
    expect((await analyst.req('PUT', `${tableUrl}/versions/1/points`, { lockVersion: v.lockVersion, points: [{ x: '60', y: '1.5' }] })).status).toBe(400)
    expect((await analyst.req('PUT', `${tableUrl}/versions/1/points`, { lockVersion: v.lockVersion, points: [{ x: '60', y: '0.1' }, { x: '60.0', y: '0.2' }] })).status).toBe(400)
    const auditor = await signedIn(DEMO.auditor)
    expect((await auditor.req('PUT', `${tableUrl}/versions/1/points`, { lockVersion: v.lockVersion, points: v.points })).status).toBe(403)
  })

  it('never edits a signed-off version; a new draft copies it with number + 1', async () => {
    const url = await freshTable(analyst)
    const v1 = (await analyst.get<Version>(`${url}/versions/1`)).body
    expect((await analyst.post(`${url}/versions`, { fromNumber: 1 })).status).toBe(409) // a draft cannot be the source
    await ownerDb().query(`UPDATE table_versions SET status = 'approved' WHERE id = :id`, { replacements: { id: v1.id } })
    expect((await analyst.req('PUT', `${url}/versions/1/points`, { lockVersion: v1.lockVersion, points: v1.points })).status).toBe(409)
    const v2 = await analyst.post<Version>(`${url}/versions`, { fromNumber: 1 })
    expect(v2.status).toBe(201)
    expect(v2.body).toMatchObject({ number: 2, status: 'draft', points: v1.points, contentHash: v1.contentHash })
    expect((await analyst.post(`${url}/versions`, { fromNumber: 1 })).status).toBe(409) // v2 is still open
  })
})
