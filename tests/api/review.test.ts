import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { Client, DEMO, LARKSPUR, closeOwnerDb, ownerDb, signedIn } from './helpers'
import { filledDraft, newTable, statusOf } from './review-helpers'
import { waitForMail } from './fakes'
import type { ReviewStateDto } from '#shared/types/review'

const base = (tableId: string, n: number) => `/api/orgs/${LARKSPUR}/tables/${tableId}/versions/${n}`
let analyst: Client, actuary: Client, felix: Client, auditor: Client

beforeAll(async () => {
  analyst = await signedIn(DEMO.analyst)
  actuary = await signedIn(DEMO.actuary)
  felix = await signedIn(DEMO.both)
  auditor = await signedIn(DEMO.auditor)
})
afterAll(closeOwnerDb)

describe('maker-checker review', () => {
  it('refuses to submit a draft without a fill', async () => {
    const tableId = await newTable(LARKSPUR, DEMO.analyst)
    await ownerDb().query(`INSERT INTO table_versions (org_id, table_id, number, author_id, content_hash) SELECT org_id, id, 1, created_by, 'x' FROM rate_tables WHERE id = :tableId`, { replacements: { tableId } })
    const r = await analyst.post(`${base(tableId, 1)}/submit`, {})
    expect(r.status).toBe(409)
  })

  it('nobody signs off their own work: the author who submitted gets 403 and the version stays awaiting', async () => {
    const tableId = await newTable(LARKSPUR, DEMO.actuary)
    const v = await filledDraft(tableId, DEMO.actuary)
    expect((await actuary.post<ReviewStateDto>(`${base(tableId, v.number)}/submit`, { note: 'please check' })).status).toBe(200)
    const review = await actuary.get<ReviewStateDto>(`${base(tableId, v.number)}/review`)
    expect(review.body.you.canDecide).toBe(false)
    expect(review.body.you.decideBlockedReason).toMatch(/another actuary/)
    const r = await actuary.post<{ statusMessage: string }>(`${base(tableId, v.number)}/approve`, {})
    expect(r.status).toBe(403)
    expect(r.body.statusMessage).toMatch(/cannot sign it off/)
    expect(await statusOf(v.id)).toBe('in-review')
  })

  it('someone who only submitted (not the author) cannot sign it off either', async () => {
    const tableId = await newTable(LARKSPUR, DEMO.analyst)
    const v = await filledDraft(tableId, DEMO.analyst)
    expect((await actuary.post(`${base(tableId, v.number)}/submit`, {})).status).toBe(200)
    expect((await actuary.post(`${base(tableId, v.number)}/approve`, {})).status).toBe(403)
    expect((await analyst.post(`${base(tableId, v.number)}/approve`, {})).status).toBe(403) // role: analysts never decide
    expect((await auditor.post(`${base(tableId, v.number)}/submit`, {})).status).toBe(403)
  })

  it('send back needs a comment, returns a working draft and keeps the thread', async () => {
    const tableId = await newTable(LARKSPUR, DEMO.analyst)
    const v = await filledDraft(tableId, DEMO.analyst)
    await analyst.post(`${base(tableId, v.number)}/submit`, {})
    expect((await felix.post(`${base(tableId, v.number)}/send-back`, {})).status).toBe(400)
    const r = await felix.post<ReviewStateDto>(`${base(tableId, v.number)}/send-back`, { comment: 'Age 65 looks high; check the source.' })
    expect(r.status).toBe(200)
    expect(r.body.status).toBe('draft')
    expect(r.body.comments.map(c => c.kind)).toEqual(['submit', 'send-back'])
    expect(r.body.comments[1]!.body).toContain('Age 65')
  })

  it('approval supersedes the previous signed-off version; the database then refuses any change to either', async () => {
    const tableId = await newTable(LARKSPUR, DEMO.analyst)
    const v1 = await filledDraft(tableId, DEMO.analyst)
    await analyst.post(`${base(tableId, v1.number)}/submit`, {})
    const first = await felix.post<ReviewStateDto>(`${base(tableId, v1.number)}/approve`, { comment: 'Fine.' })
    expect(first.status).toBe(200)
    expect(first.body.status).toBe('approved')
    expect(first.body.approvedBy?.email).toBe(DEMO.both)
    const v2 = await filledDraft(tableId, DEMO.analyst, '0.001')
    await analyst.post(`${base(tableId, v2.number)}/submit`, {})
    expect((await actuary.post(`${base(tableId, v2.number)}/approve`, {})).status).toBe(200)
    expect(await statusOf(v1.id)).toBe('retired')
    const old = await auditor.get<ReviewStateDto>(`${base(tableId, v1.number)}/review`)
    expect(old.body.supersededBy).toBe(v2.number)

    // triggers apply to every role, the schema owner included
    const refused = async (sql: string, id: string) => {
      const error = await ownerDb().query(sql, { replacements: { id } }).then(() => null, (e: Error) => e)
      expect(error?.message, sql).toMatch(/cannot change/)
    }
    await refused('UPDATE version_points SET y = y + 1 WHERE version_id = :id', v2.id)
    await refused('UPDATE version_fill_points SET y = y + 1 WHERE version_id = :id', v2.id)
    await refused('DELETE FROM version_fill_points WHERE version_id = :id', v2.id)
    await refused('INSERT INTO version_points (version_id, x, y) VALUES (:id, 99, 0.5)', v2.id)
    await refused('UPDATE table_versions SET notes = \'edited\' WHERE id = :id', v2.id)
    await refused('UPDATE table_versions SET status = \'retired\', fill_rationale = \'sneaky\' WHERE id = :id', v2.id)
    await refused('DELETE FROM table_versions WHERE id = :id', v2.id)
    await refused('UPDATE version_points SET y = y + 1 WHERE version_id = :id', v1.id) // retired stays frozen
    await refused('UPDATE table_versions SET status = \'approved\' WHERE id = :id', v1.id)
    // the single allowed step: approved -> retired with its metadata
    const retire = await felix.post<ReviewStateDto>(`${base(tableId, v2.number)}/retire`, { reason: 'Basis withdrawn for the test.' })
    expect(retire.status).toBe(200)
    expect(retire.body.status).toBe('retired')
  })

  it('the queue lists versions awaiting a second check and marks the caller\u2019s own', async () => {
    const tableId = await newTable(LARKSPUR, DEMO.actuary)
    const v = await filledDraft(tableId, DEMO.actuary)
    await actuary.post(`${base(tableId, v.number)}/submit`, {})
    const mine = await actuary.get<{ versionId: string; yours: boolean }[]>(`/api/orgs/${LARKSPUR}/reviews`)
    expect(mine.body.find(q => q.versionId === v.id)?.yours).toBe(true)
    const theirs = await felix.get<{ versionId: string; yours: boolean }[]>(`/api/orgs/${LARKSPUR}/reviews`)
    expect(theirs.body.find(q => q.versionId === v.id)?.yours).toBe(false)
  })

  it('review requests reach the other actuaries by e-mail (local mail fake), when the fake runs', async () => {
    const inbox = process.env.KW_MAIL_INBOX_URL
    if (!inbox) return // the suite runs with the fake under npm test; a bare server has no SMTP and logs the failure
    const tableId = await newTable(LARKSPUR, DEMO.analyst)
    const v = await filledDraft(tableId, DEMO.analyst)
    await analyst.post(`${base(tableId, v.number)}/submit`, {})
    const mail = await waitForMail(DEMO.both, 'Second check requested')
    expect(mail.subject).toContain('Second check requested')
  })
})
