// Issue 11, item 7 and 6: the audit trail is anchored (signed checkpoints at sign-off and daily, the head in every signed
// file and read-API answer), so removing the newest events shows; its numbering is gapless; it reads as sentences with
// names, filters by the reader's days, and exports as CSV that a script re-checks without Knotwork.
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { QueryTypes } from 'sequelize'
import { Client, DEMO, LARKSPUR, closeOwnerDb, freshOrg, ownerDb, signedIn } from './helpers'
import { filledDraft, newTable, userId } from './review-helpers'
import { checkAuditCsv } from '~~/scripts/verify-audit-csv'
import { headSignatureHolds } from '~~/server/lib/signing'
import type { AuditPageDto, AuditVerifyDto } from '#shared/types/audit'
import type { ExportVerdictDto } from '#shared/types/exports'

const one = async <T extends object>(sql: string, replacements: Record<string, unknown>) => (await ownerDb().query<T>(sql, { replacements, type: QueryTypes.SELECT }))[0]!
let tomas: Client, felix: Client
let org: { slug: string, orgId: string, client: Client }

/** A fresh organisation (so removing its events disturbs no other test) where Tomas makes tables and Felix signs them off. */
beforeAll(async () => {
  org = await freshOrg()
  for (const [email, role] of [[DEMO.actuary, 'actuary'], [DEMO.both, 'actuary']]) {
    await ownerDb().query('INSERT INTO memberships (org_id, user_id, role) VALUES (:orgId, :user, :role)', { replacements: { orgId: org.orgId, user: await userId(email), role } })
  }
  tomas = await signedIn(DEMO.actuary)
  felix = await signedIn(DEMO.both)
})
afterAll(closeOwnerDb)

async function signOff(): Promise<{ path: string, tableId: string }> {
  const tableId = await newTable(org.slug, DEMO.actuary)
  const v = await filledDraft(tableId, DEMO.actuary)
  const path = `/api/orgs/${org.slug}/tables/${tableId}/versions/${v.number}`
  expect((await tomas.post(`${path}/submit`, {})).status).toBe(200)
  expect((await felix.post(`${path}/approve`, {})).status).toBe(200)
  return { path, tableId }
}
const verify = (query = '') => org.client.get<AuditVerifyDto>(`/api/orgs/${org.slug}/audit/verify${query}`)
async function upload(file: Buffer) {
  const form = new FormData()
  form.append('file', new Blob([new Uint8Array(file)]), 'export.xlsx')
  return tomas.req<ExportVerdictDto>('POST', `/api/orgs/${org.slug}/exports/verify`, form)
}

describe('anchors of the audit trail', () => {
  it('a sign-off writes a checkpoint signed with the organisation\u2019s key, whose head is the sign-off event', async () => {
    await signOff()
    const approve = await one<{ seq: string, hash: string }>(`SELECT seq, hash FROM audit_events WHERE org_id = :orgId AND action = 'version.approve' ORDER BY seq DESC LIMIT 1`, { orgId: org.orgId })
    const cp = await one<{ statement: string, signature: string, head_seq: string, reason: string }>(`SELECT * FROM audit_checkpoints WHERE org_id = :orgId AND reason = 'sign-off' ORDER BY id DESC LIMIT 1`, { orgId: org.orgId })
    expect([cp.head_seq, JSON.parse(cp.statement).head.hash]).toEqual([approve.seq, approve.hash])
    const keys = (await new Client().get<{ keys: { kid: string, x: string }[] }>(`/api/keys/${org.slug}.json`)).body.keys
    const statement = JSON.parse(cp.statement)
    expect(headSignatureHolds({ statement, signature: cp.signature }, keys.find(k => k.kid === statement.keyId)!.x)).toBe(true)
    const r = await verify()
    expect(r.body.chains.find(c => c.chain === 'org')).toMatchObject({ intact: true, gaps: [] })
    expect(r.body.anchors.every(a => a.state === 'present')).toBe(true)
  })

  it('removing the newest events (triggers disabled, as the owner) is found against the checkpoint, the exported head and a given head, and names the missing events', async () => {
    const { path } = await signOff()
    const approve = await one<{ seq: string }>(`SELECT seq FROM audit_events WHERE org_id = :orgId AND action = 'version.approve' ORDER BY seq DESC LIMIT 1`, { orgId: org.orgId })
    const file = Buffer.from(await (await fetch(`${process.env.KW_BASE_URL ?? 'http://127.0.0.1:3000'}${path}/export`, { headers: { cookie: tomas.cookie, 'x-forwarded-for': tomas.address } })).arrayBuffer())
    const head = await one<{ seq: string, hash: string }>('SELECT seq, hash FROM audit_events WHERE org_id = :orgId ORDER BY seq DESC LIMIT 1', { orgId: org.orgId })
    const newest = Number(head.seq)
    expect((await upload(file)).body.trail?.state).toBe('present')

    await ownerDb().query(`ALTER TABLE audit_events DISABLE TRIGGER audit_events_no_change;
      DELETE FROM audit_events WHERE org_id = '${org.orgId}' AND seq >= ${Number(approve.seq)};
      ALTER TABLE audit_events ENABLE TRIGGER audit_events_no_change;`)
    const r = await verify(`?number=${newest}&hash=${head.hash}`)
    const chain = r.body.chains.find(c => c.chain === 'org')!
    expect(chain.intact).toBe(true) // the shorter chain still links up: that is why anchors are needed
    const fromCheckpoint = r.body.anchors.find(a => a.source === 'checkpoint')!
    expect(fromCheckpoint.state).toBe('missing')
    expect(fromCheckpoint.missing).toEqual({ from: Number(approve.seq), to: Number(approve.seq) }) // the sign-off event itself
    expect(fromCheckpoint.message).toMatch(new RegExp(`Events? #${approve.seq}`))
    const given = r.body.anchors.find(a => a.source === 'given')!
    expect(given).toMatchObject({ state: 'missing', missing: { from: Number(approve.seq), to: newest } })
    expect(given.message).toMatch(`the trail now ends at #${Number(approve.seq) - 1}`)
    const checked = await upload(file)
    expect(checked.body.trail).toMatchObject({ state: 'missing' })
  })

  it('an event removed from the middle breaks a link and leaves a gap in the numbering; both are reported', async () => {
    const { client, orgId, slug } = await freshOrg()
    await client.post(`/api/orgs/${slug}/signing-keys/rotate`)
    await client.post(`/api/orgs/${slug}/signing-keys/rotate`)
    const middle = await one<{ seq: string }>('SELECT seq FROM audit_events WHERE org_id = :orgId ORDER BY seq LIMIT 1 OFFSET 1', { orgId })
    await ownerDb().query(`ALTER TABLE audit_events DISABLE TRIGGER audit_events_no_change;
      DELETE FROM audit_events WHERE org_id = '${orgId}' AND seq = ${Number(middle.seq)};
      ALTER TABLE audit_events ENABLE TRIGGER audit_events_no_change;`)
    const chain = (await client.get<AuditVerifyDto>(`/api/orgs/${slug}/audit/verify`)).body.chains.find(c => c.chain === 'org')!
    expect(chain.intact).toBe(false)
    expect(chain.brokenAt?.number).toBe(Number(middle.seq) + 1)
    expect(chain.gaps).toEqual([{ from: Number(middle.seq), to: Number(middle.seq) }])
  })

  it('a checkpoint is written at the first audit read of a day, once per organisation and day', async () => {
    const { client, orgId, slug } = await freshOrg()
    await Promise.all([0, 1, 2].map(() => client.get(`/api/orgs/${slug}/audit`)))
    const daily = await one<{ n: number }>(`SELECT count(*)::int AS n FROM audit_checkpoints WHERE org_id = :orgId AND reason = 'daily'`, { orgId })
    expect(daily.n).toBe(1)
  })
})

describe('a readable, exportable trail', () => {
  it('numbers the organisation\u2019s events without gaps and tells each as a sentence with names', async () => {
    const auditor = await signedIn(DEMO.auditor)
    const page = (await auditor.get<AuditPageDto>(`/api/orgs/${LARKSPUR}/audit?pageSize=200`)).body
    const own = page.events.filter(e => e.chain === 'org').map(e => e.number).sort((a, b) => a - b)
    expect(own.at(-1)! - own[0]! + 1).toBe(own.length)
    for (const e of page.events) expect(e.sentence).not.toMatch(/[0-9a-f]{8}-[0-9a-f]{4}-|tableId|: \{/)
    const curve = await one<{ id: string }>(`SELECT t.id FROM rate_tables t JOIN organisations o ON o.id = t.org_id WHERE o.slug = :slug AND t.name = 'Discount curve 2026-09-30'`, { slug: LARKSPUR })
    const seeded = (await auditor.get<AuditPageDto>(`/api/orgs/${LARKSPUR}/audit?action=version.approve&table=${curve.id}`)).body.events.at(-1)
    expect(seeded?.sentence).toBe('Signed off version 1 of Discount curve 2026-09-30.')
    const joined = (await auditor.get<AuditPageDto>(`/api/orgs/${LARKSPUR}/audit?action=member.add`)).body.events.at(-1)
    expect(joined?.sentence).toMatch(/^[A-Z][a-z]+ [A-Z][a-z]+ joined as (administrator|actuary|analyst|auditor)\.$/)
  })

  it('filters by the reader\u2019s days (their time zone) and refuses a day that is not in the calendar', async () => {
    const auditor = await signedIn(DEMO.auditor)
    const event = (await auditor.get<AuditPageDto>(`/api/orgs/${LARKSPUR}/audit?action=version.approve`)).body.events[0]!
    const dayAt = (offset: number, plus = 0) => new Date(Date.parse(event.at) + offset * 60_000 + plus * 86_400_000).toISOString().slice(0, 10)
    const has = async (day: string, offset: number) => (await auditor.get<AuditPageDto>(`/api/orgs/${LARKSPUR}/audit?action=version.approve&pageSize=200&from=${day}&to=${day}&offset=${offset}`)).body.events.some(e => e.id === event.id)
    for (const offset of [840, 0, -720]) {
      expect(await has(dayAt(offset), offset), `offset ${offset}`).toBe(true)
      expect(await has(dayAt(offset, 1), offset), `offset ${offset}, the day after`).toBe(false)
    }
    expect((await auditor.get(`/api/orgs/${LARKSPUR}/audit?from=2026-02-30`)).status).toBe(400)
    expect((await auditor.get(`/api/orgs/${LARKSPUR}/audit?from=2026-12-02&to=2026-12-01`)).status).toBe(400)
  })

  it('the CSV carries every event\u2019s hash and hashed record; the offline script re-checks it and finds a changed record', async () => {
    const res = await fetch(`${process.env.KW_BASE_URL ?? 'http://127.0.0.1:3000'}/api/orgs/${org.slug}/audit/export`, { headers: { cookie: org.client.cookie, 'x-forwarded-for': org.client.address } })
    expect(res.status).toBe(200)
    expect(res.headers.get('content-type')).toContain('text/csv')
    const text = await res.text()
    expect(text.split('\r\n')[0]).toContain('Number,Trail,When (UTC),Who,E-mail,What happened,Action,Outcome,Hash,Previous hash,Hashed record (RFC 8785 JSON)')
    const ok = checkAuditCsv(text)
    expect(ok.problems).toEqual([])
    expect(ok.events).toBeGreaterThan(3)
    const tampered = text.replace(/"version\.approve"/, '"version.retire"')
    expect(checkAuditCsv(tampered).problems.join(' ')).toMatch(/does not match its hash/)
    const newest = [...ok.newest.values()][0]!
    expect(checkAuditCsv(text, { number: newest.number + 1, hash: 'ab'.repeat(32) }).problems.join(' ')).toMatch(/does not hold event/)
  })
})
