import { afterAll, describe, expect, it } from 'vitest'
import { DEMO, FENWICK, LARKSPUR, closeOwnerDb, ownerDb, signedIn } from './helpers'
import { filledDraft, newTable } from './review-helpers'
import type { VersionDiffDto } from '#shared/types/diff'

afterAll(closeOwnerDb)

describe('version diff', () => {
  it('shows points changed, added and removed, the largest value difference exactly, and the money difference', async () => {
    const tableId = await newTable(LARKSPUR, DEMO.analyst)
    await filledDraft(tableId, DEMO.analyst)
    const second = await filledDraft(tableId, DEMO.analyst, '0.0001')
    // one point more in version 2
    await ownerDb().query('INSERT INTO version_points (version_id, x, y) VALUES (:id, 75, 0.04)', { replacements: { id: second.id } })
    const auditor = await signedIn(DEMO.auditor)
    const r = await auditor.get<VersionDiffDto>(`/api/orgs/${LARKSPUR}/tables/${tableId}/diff?a=1&b=2`)
    expect(r.status).toBe(200)
    expect(r.body.points.changed).toBe(3)
    expect(r.body.points.added).toBe(1)
    expect(r.body.points.removed).toBe(0)
    expect(r.body.points.rows.find(p => p.x === '75')).toMatchObject({ change: 'added', a: null, b: '0.04' })
    // every filled value moved by exactly 0.0001 (decimal arithmetic, no float noise)
    expect(r.body.values.changed).toBe(11)
    expect(r.body.values.largest?.difference).toBe('0.0001')
    const e65 = r.body.money.find(m => m.key === 'e65')
    expect(e65).toMatchObject({ a: '17.1', b: '17.4' })
    expect(e65?.difference).toBe('0.3')
  })

  it('answers 404 for another organisation\'s table and 400 for a missing version number', async () => {
    const tableId = await newTable(LARKSPUR, DEMO.analyst)
    await filledDraft(tableId, DEMO.analyst)
    const other = await signedIn(DEMO.otherAdmin)
    expect((await other.get(`/api/orgs/${FENWICK}/tables/${tableId}/diff?a=1&b=1`)).status).toBe(404)
    const auditor = await signedIn(DEMO.auditor)
    expect((await auditor.get(`/api/orgs/${LARKSPUR}/tables/${tableId}/diff?a=1`)).status).toBe(400)
  })
})
