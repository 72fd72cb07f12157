// A fill is tied to the points it was fitted on (issue 11, item 1): submit and sign-off refuse a fill fitted on other
// points (409 fill-stale), re-choosing the fill makes them pass, and PostgreSQL itself refuses the status change for
// every role (migration 0701), also when the points change later in the same transaction.
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { QueryTypes } from 'sequelize'
import { pointsContentHash } from '~~/server/lib/points-hash'
import { Client, DEMO, LARKSPUR, closeOwnerDb, ownerDb, signedIn } from './helpers'
import { filledDraft, newTable, statusOf, userId } from './review-helpers'
import type { ReviewStateDto } from '#shared/types/review'
import type { SavedFillDto } from '#shared/types/fills'
import type { VersionDto } from '#shared/types/tables'

const base = (tableId: string, n: number) => `/api/orgs/${LARKSPUR}/tables/${tableId}/versions/${n}`
const GRID = { from: '60', to: '80', step: '1' }
let analyst: Client, felix: Client
beforeAll(async () => {
  analyst = await signedIn(DEMO.analyst)
  felix = await signedIn(DEMO.both)
})
afterAll(closeOwnerDb)

/** A working draft with five given points, made behind the app's back; returns its table and number. */
async function draftWithPoints(): Promise<{ tableId: string, number: number, id: string }> {
  const tableId = await newTable(LARKSPUR, DEMO.analyst)
  const [v] = await ownerDb().query<{ id: string }>(`INSERT INTO table_versions (org_id, table_id, number, author_id, content_hash)
    SELECT org_id, id, 1, :author, 'pending' FROM rate_tables WHERE id = :tableId RETURNING id`, { replacements: { tableId, author: await userId(DEMO.analyst) }, type: QueryTypes.SELECT })
  for (const [x, y] of [['60', '0.008'], ['65', '0.012'], ['70', '0.019'], ['75', '0.031'], ['80', '0.05']]) {
    await ownerDb().query('INSERT INTO version_points (version_id, x, y) VALUES (:id, :x, :y)', { replacements: { id: v!.id, x, y } })
  }
  await ownerDb().query('UPDATE table_versions SET content_hash = kw_points_hash(id) WHERE id = :id', { replacements: { id: v!.id } })
  return { tableId, number: 1, id: v!.id }
}

async function chooseFill(path: string, lockVersion: number) {
  return analyst.post<SavedFillDto>(`${path}/fill`, { grid: GRID, choice: { method: 'cubic-natural' }, rationale: 'Smooth through the points, no zig-zag.', lockVersion })
}

describe('a fill fitted on other points', () => {
  it('cannot be submitted (409 fill-stale, reason in the review state); choosing the fill again makes submit and sign-off pass', async () => {
    const d = await draftWithPoints()
    const path = base(d.tableId, d.number)
    const fill = await chooseFill(path, 0)
    expect(fill.status).toBe(200)
    expect(fill.body.stale).toBe(false)
    expect(fill.body.fittedOn.contentHash).toBe((await analyst.get<VersionDto>(path)).body.contentHash)

    // the analyst changes a given point after the fill was chosen
    const version = (await analyst.get<VersionDto>(path)).body
    const changed = version.points.map(p => (p.x === '70' ? { ...p, y: '0.02' } : p))
    expect((await analyst.req('PUT', `${path}/points`, { points: changed, lockVersion: version.lockVersion })).status).toBe(200)
    expect((await analyst.get<{ fill: SavedFillDto }>(`${path}/fill`)).body.fill.stale).toBe(true)

    const refused = await analyst.post<{ statusMessage: string, data: { code: string } }>(`${path}/submit`, {})
    expect(refused.status).toBe(409)
    expect(refused.body.data.code).toBe('fill-stale')
    expect(refused.body.statusMessage).toMatch(/fitted on other points.*choose the fill again/)
    const state = (await analyst.get<ReviewStateDto>(`${path}/review`)).body
    expect(state.fillStale).toBe(true)
    expect(state.you.canSubmit).toBe(false)
    expect(state.you.submitBlockedReason).toMatch(/fill bench/)
    expect(await statusOf(d.id)).toBe('draft')

    const again = await chooseFill(path, (await analyst.get<VersionDto>(path)).body.lockVersion)
    expect(again.status).toBe(200)
    expect(again.body.stale).toBe(false)
    expect((await analyst.post(`${path}/submit`, {})).status).toBe(200)
    expect((await felix.post<ReviewStateDto>(`${path}/approve`, {})).body.status).toBe('approved')
  })

  it('awaiting a check with points changed behind the app: sign-off is refused by the app, and by the database when the hash column lies', async () => {
    const tableId = await newTable(LARKSPUR, DEMO.analyst)
    const v = await filledDraft(tableId, DEMO.analyst)
    const path = base(tableId, v.number)
    expect((await analyst.post(`${path}/submit`, {})).status).toBe(200)
    // a point changed and the content hash kept honest: the app sees the fill is stale
    await ownerDb().query('UPDATE version_points SET y = y + 0.001 WHERE version_id = :id AND x = 65', { replacements: { id: v.id } })
    await ownerDb().query('UPDATE table_versions SET content_hash = kw_points_hash(id) WHERE id = :id', { replacements: { id: v.id } })
    const review = (await felix.get<ReviewStateDto>(`${path}/review`)).body
    expect(review.you.signOffBlockedReason).toMatch(/Send it back/)
    const byApp = await felix.post<{ data: { code: string } }>(`${path}/approve`, {})
    expect([byApp.status, byApp.body.data.code]).toEqual([409, 'fill-stale'])
    // the content hash column claims the fill still fits: only PostgreSQL's recomputed hash knows better
    await ownerDb().query('UPDATE table_versions SET content_hash = fill_points_hash WHERE id = :id', { replacements: { id: v.id } })
    const byDatabase = await felix.post<{ data: { code: string } }>(`${path}/approve`, {})
    expect([byDatabase.status, byDatabase.body.data.code]).toEqual([409, 'fill-stale'])
    expect(await statusOf(v.id)).toBe('in-review')
  })
})

describe('the database refuses a stale fill for every role (SQL as the schema owner)', () => {
  const inTransaction = async (statements: string[], id: string) => {
    const t = await ownerDb().transaction()
    try {
      for (const sql of statements) await ownerDb().query(sql, { replacements: { id }, transaction: t })
      await t.commit()
      return null
    } catch (error) {
      if (!(t as unknown as { finished?: string }).finished) await t.rollback().catch(() => {})
      return error as Error & { original?: { constraint?: string } }
    }
  }

  it('draft -> in-review and in-review -> approved with a stale fill are refused at commit; a current fill passes', async () => {
    const tableId = await newTable(LARKSPUR, DEMO.analyst)
    const v = await filledDraft(tableId, DEMO.analyst)
    const stale = await inTransaction(['UPDATE version_points SET y = y * 2 WHERE version_id = :id AND x = 70', 'UPDATE table_versions SET status = \'in-review\' WHERE id = :id'], v.id)
    expect(stale?.original?.constraint).toBe('fill_stale')
    expect(stale?.message).toMatch(/fitted on other points/)
    expect(await statusOf(v.id)).toBe('draft')
    expect(await inTransaction(['UPDATE table_versions SET status = \'in-review\' WHERE id = :id'], v.id)).toBeNull()
    // signing off and then changing a given point in the same transaction: the check runs at commit and sees it
    const sneaky = await inTransaction(['UPDATE table_versions SET status = \'approved\' WHERE id = :id', 'UPDATE version_points SET y = y + 0.0001 WHERE version_id = :id AND x = 60'], v.id)
    expect(sneaky?.original?.constraint).toBe('fill_stale')
    expect(await statusOf(v.id)).toBe('in-review')
    expect(await inTransaction(['DELETE FROM version_fill_points WHERE version_id = :id', 'UPDATE table_versions SET status = \'approved\' WHERE id = :id'], v.id).then(e => e?.original?.constraint)).toBe('fill_missing')
    expect(await inTransaction(['UPDATE table_versions SET status = \'approved\' WHERE id = :id'], v.id)).toBeNull()
    expect(await statusOf(v.id)).toBe('approved')
  })

  // The SQL hash must be the app's content hash (server/lib/points-hash.ts) for any spelling PostgreSQL stores.
  it('kw_points_hash equals pointsContentHash for trailing zeros, negatives, integers and long decimals', async () => {
    const tableId = await newTable(LARKSPUR, DEMO.analyst)
    const [v] = await ownerDb().query<{ id: string }>(`INSERT INTO table_versions (org_id, table_id, number, content_hash) SELECT org_id, id, 1, 'x' FROM rate_tables WHERE id = :tableId RETURNING id`,
      { replacements: { tableId }, type: QueryTypes.SELECT })
    const points = [{ x: '0.25', y: '-0.0150' }, { x: '100', y: '0.5000' }, { x: '55.0', y: '0' }, { x: '7', y: '0.000000000000000000000000000000000012345' }, { x: '30', y: '12345678901234567890.25' }]
    for (const p of points) await ownerDb().query('INSERT INTO version_points (version_id, x, y) VALUES (:id, :x::numeric, :y::numeric)', { replacements: { id: v!.id, ...p } })
    const [{ hash }] = await ownerDb().query<{ hash: string }>('SELECT kw_points_hash(:id) AS hash', { replacements: { id: v!.id }, type: QueryTypes.SELECT }) as [{ hash: string }]
    expect(hash).toBe(pointsContentHash(points))
  })
})
