import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { Client, DEMO, FENWICK, LARKSPUR, closeOwnerDb, signedIn } from './helpers'
import { upload } from './import-helpers'
import { filledDraft, newTable } from './review-helpers'
import type { MySubmissionDto, MyUploadDto } from '#shared/types/my-work'

// Issue 18: "My uploads" and "My submissions" list only the caller's own work in the organisation of the URL.
let analyst: Client, actuary: Client, felix: Client, otherAdmin: Client
beforeAll(async () => {
  analyst = await signedIn(DEMO.analyst)
  actuary = await signedIn(DEMO.actuary)
  felix = await signedIn(DEMO.both)
  otherAdmin = await signedIn(DEMO.otherAdmin)
})
afterAll(closeOwnerDb)
const uploads = `/api/orgs/${LARKSPUR}/my/uploads`
const submissions = `/api/orgs/${LARKSPUR}/my/submissions`

describe('my uploads', () => {
  it('lists the owner\u2019s unfinished upload to the owner only, and forgets it once discarded', async () => {
    const up = await upload(analyst, LARKSPUR, `mine-${Date.now()}.csv`, 'age,q\n60,0.01\n65,0.02\n')
    expect(up.status, JSON.stringify(up.body)).toBe(201)
    const id = (up.body as { id: string }).id
    const mine = await analyst.get<MyUploadDto[]>(uploads)
    expect(mine.status).toBe(200)
    expect(mine.body.find(u => u.id === id)).toMatchObject({ fileKind: 'csv', fileName: expect.stringMatching(/^mine-/) })
    const theirs = await actuary.get<MyUploadDto[]>(uploads)
    expect(theirs.status).toBe(200)
    expect(theirs.body.map(u => u.id)).not.toContain(id)
    // another organisation's member: the org in the URL is not theirs (404); in their own org the upload is absent
    expect((await otherAdmin.get(uploads)).status).toBe(404)
    const elsewhere = await felix.get<MyUploadDto[]>(`/api/orgs/${FENWICK}/my/uploads`)
    if (elsewhere.status === 200) expect(elsewhere.body.map(u => u.id)).not.toContain(id)
    else expect(elsewhere.status).toBe(403)

    expect((await analyst.req('DELETE', `/api/orgs/${LARKSPUR}/imports/${id}`)).status).toBe(200)
    expect((await analyst.get<MyUploadDto[]>(uploads)).body.map(u => u.id)).not.toContain(id)
  })
})

describe('my submissions', () => {
  it('shows the submitter each version with its state: awaiting, then sent back with the reason', async () => {
    const tableId = await newTable(LARKSPUR, DEMO.analyst)
    const v = await filledDraft(tableId, DEMO.analyst)
    const versionUrl = `/api/orgs/${LARKSPUR}/tables/${tableId}/versions/${v.number}`
    expect((await analyst.post(`${versionUrl}/submit`, {})).status).toBe(200)
    const awaiting = await analyst.get<MySubmissionDto[]>(submissions)
    expect(awaiting.body.find(s => s.tableId === tableId)).toMatchObject({ number: v.number, status: 'in-review', outcome: 'awaiting', decidedAt: null })
    // the actuary did not submit it
    expect((await actuary.get<MySubmissionDto[]>(submissions)).body.map(s => s.tableId)).not.toContain(tableId)
    expect((await felix.post(`${versionUrl}/send-back`, { comment: 'Check age 65 against the source.' })).status).toBe(200)
    const back = await analyst.get<MySubmissionDto[]>(submissions)
    expect(back.body.find(s => s.tableId === tableId)).toMatchObject({ status: 'draft', outcome: 'sent-back', reason: 'Check age 65 against the source.' })
    expect((await otherAdmin.get(submissions)).status).toBe(404)
  })
})
