// The read API for production systems. The signature is checked outside the app's own code: RFC 8785 canonical JSON by
// the canonicalize package and Ed25519 (RFC 8032) by Node's crypto, against the published JWK set.
import { createPublicKey, verify } from 'node:crypto'
import canonicalize from 'canonicalize'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { BASE, Client, DEMO, FENWICK, LARKSPUR, closeOwnerDb, count, ownerDb, signedIn } from './helpers'
import { filledDraft, newTable } from './review-helpers'

afterAll(closeOwnerDb)
let admin: Client
let token: string
let tokenId: string

/** Reads (or 304 answers) counted for the 'Valuation system' token, over every version and day. */
async function usage(column: 'reads' | 'not_modified'): Promise<number> {
  const [rows] = await ownerDb().query(`SELECT coalesce(sum(${column}), 0)::int AS n FROM read_token_usage WHERE token_id = :tokenId`, { replacements: { tokenId } })
  return (rows as { n: number }[])[0]!.n
}

const read = (path: string, bearer = token, headers: Record<string, string> = {}) => fetch(`${BASE}${path}`, { headers: { authorization: `Bearer ${bearer}`, accept: 'application/json', ...headers } })

beforeAll(async () => {
  admin = await signedIn(DEMO.admin)
  const r = await admin.post<{ token: string, readToken: { id: string, name: string, hint: string } }>(`/api/orgs/${LARKSPUR}/read-tokens`, { name: 'Valuation system' })
  expect(r.status).toBe(201)
  token = r.body.token
  tokenId = r.body.readToken.id
})

describe('read tokens', () => {
  it('are shown once; the list names them by a hint and never holds the token', async () => {
    expect(token).toMatch(/^kwr_[A-Za-z0-9_-]{43}$/)
    const list = await admin.get<{ id: string, name: string, hint: string }[]>(`/api/orgs/${LARKSPUR}/read-tokens`)
    const mine = list.body.find(t => t.id === tokenId)!
    expect(mine).toMatchObject({ name: 'Valuation system', hint: `${token.slice(0, 8)}…${token.slice(-4)}` })
    expect(JSON.stringify(list.body)).not.toContain(token)
  })

  it('refuses a missing, malformed or unknown token with 401 and says how to authenticate', async () => {
    for (const bearer of ['', 'nonsense', `kwr_${'A'.repeat(43)}`]) {
      const r = await read('/api/v1/tables', bearer)
      expect(r.status).toBe(401)
      expect(r.headers.get('www-authenticate')).toContain('Bearer')
    }
  })
})

describe('the read API', () => {
  it('lists only this organisation\'s tables that have a signed-off version', async () => {
    const r = await read('/api/v1/tables')
    expect(r.status).toBe(200)
    const tables = await r.json() as { name: string, signedOff: { number: number } }[]
    expect(tables.map(t => t.name)).toEqual(expect.arrayContaining(['Discount curve 2026-09-30', 'Pensioner mortality, female']))
    expect(tables.map(t => t.name)).not.toContain('Lapse rates, regular premium savings') // a working draft only
    expect(tables.map(t => t.name)).not.toContain('Client scheme mortality, unisex') // another organisation's
  })

  it('returns a signed-off table with an Ed25519 signature that verifies against the published keys, and counts the read', async () => {
    const tables = await (await read('/api/v1/tables')).json() as { id: string, name: string }[]
    const curve = tables.find(t => t.name === 'Discount curve 2026-09-30')!
    const r = await read(`/api/v1/tables/${curve.id}`)
    expect(r.status).toBe(200)
    const body = await r.json() as { content: { format: string, table: { name: string }, version: { status: string }, points: [string, string][] }, signature: string, keyId: string, auditHead: { statement: { format: string, head: { number: number, hash: string } }, signature: string } }
    expect(body.content).toMatchObject({ format: 'knotwork-signed-table/2', table: { name: 'Discount curve 2026-09-30', compounding: 'annual' }, version: { status: 'approved' } })
    expect(body.content.points.length).toBeGreaterThan(5)
    const jwks = await (await fetch(`${BASE}/api/keys/${LARKSPUR}.json`)).json() as { keys: { kid: string }[] }
    const jwk = jwks.keys.find(k => k.kid === body.keyId)!
    const ok = verify(null, Buffer.from(canonicalize(body.content)!), createPublicKey({ key: jwk as never, format: 'jwk' }), Buffer.from(body.signature, 'base64'))
    expect(ok).toBe(true)
    // beside the content, signed on its own: the head of the organisation's audit trail, which the trail still reaches
    expect(body.auditHead.statement).toMatchObject({ format: 'knotwork-audit-head/1', reason: 'read-api' })
    expect(verify(null, Buffer.from(canonicalize(body.auditHead.statement)!), createPublicKey({ key: jwk as never, format: 'jwk' }), Buffer.from(body.auditHead.signature, 'base64'))).toBe(true)
    const [[stored]] = await ownerDb().query('SELECT hash FROM audit_events e JOIN organisations o ON o.id = e.org_id WHERE o.slug = :slug AND e.seq = :n', { replacements: { slug: LARKSPUR, n: body.auditHead.statement.head.number } }) as [[{ hash: string }], unknown]
    expect(stored.hash).toBe(body.auditHead.statement.head.hash)
    expect(await usage('reads')).toBeGreaterThan(0)
  })

  it('signs each version\'s answer once and serves the stored bytes; a renamed table or a new key gets a new answer that verifies', async () => {
    const analyst = await signedIn(DEMO.analyst)
    const tableId = await newTable(LARKSPUR, DEMO.analyst)
    const v = await filledDraft(tableId, DEMO.analyst)
    const base = `/api/orgs/${LARKSPUR}/tables/${tableId}/versions/${v.number}`
    expect((await analyst.post(`${base}/submit`, {})).status).toBe(200)
    expect((await (await signedIn(DEMO.both)).post(`${base}/approve`, {})).status).toBe(200)
    // the signed part (content, signature, key id) is the same, signing time included, even for reads racing the first
    // one; only the trail's head beside it is stated anew
    const signedPart = (text: string) => { const { auditHead, ...rest } = JSON.parse(text) as { auditHead: unknown }; expect(auditHead).toBeTruthy(); return JSON.stringify(rest) }
    const answers = await Promise.all(Array.from({ length: 6 }, () => read(`/api/v1/tables/${tableId}`).then(r => r.text())))
    expect(new Set(answers.map(signedPart)).size).toBe(1)
    expect(await count('SELECT 1 FROM signed_bodies WHERE version_id = :id', { id: v.id })).toBe(1)
    const verifies = async (text: string) => {
      const body = JSON.parse(text) as { content: { table: { name: string } }, signature: string, keyId: string }
      const jwks = await (await fetch(`${BASE}/api/keys/${LARKSPUR}.json`)).json() as { keys: { kid: string }[] }
      const jwk = jwks.keys.find(k => k.kid === body.keyId)!
      return { name: body.content.table.name, keyId: body.keyId, ok: verify(null, Buffer.from(canonicalize(body.content)!), createPublicKey({ key: jwk as never, format: 'jwk' }), Buffer.from(body.signature, 'base64')) }
    }
    const name = `Renamed ${Date.now()}`
    expect((await analyst.req('PATCH', `/api/orgs/${LARKSPUR}/tables/${tableId}`, { name })).status).toBe(200)
    const renamed = await (await read(`/api/v1/tables/${tableId}`)).text()
    expect(await verifies(renamed)).toMatchObject({ name, ok: true })
    expect((await admin.post(`/api/orgs/${LARKSPUR}/signing-keys/rotate`, {})).status).toBe(200)
    const rekeyed = await verifies(await (await read(`/api/v1/tables/${tableId}`)).text())
    expect(rekeyed).toMatchObject({ name, ok: true })
    expect(rekeyed.keyId).not.toBe((await verifies(renamed)).keyId)
    expect(await count('SELECT 1 FROM signed_bodies WHERE version_id = :id', { id: v.id })).toBe(3)
  })

  it('answers 404 for a table without a signed-off version and for another organisation\'s table', async () => {
    const fenwickAdmin = await signedIn(DEMO.otherAdmin)
    const theirs = await fenwickAdmin.get<{ id: string, name: string }[]>(`/api/orgs/${FENWICK}/tables`)
    expect((await read(`/api/v1/tables/${theirs.body[0]!.id}`)).status).toBe(404)
    const ours = await admin.get<{ id: string, name: string }[]>(`/api/orgs/${LARKSPUR}/tables`)
    const draftOnly = ours.body.find(t => t.name === 'Lapse rates, regular premium savings')!
    expect((await read(`/api/v1/tables/${draftOnly.id}`)).status).toBe(404)
  })

  it('reads an earlier signed-off version by number, and nothing that was never signed off', async () => {
    const analyst = await signedIn(DEMO.analyst)
    const felix = await signedIn(DEMO.both)
    const tableId = await newTable(LARKSPUR, DEMO.analyst)
    const base = (n: number) => `/api/orgs/${LARKSPUR}/tables/${tableId}/versions/${n}`
    for (const bump of ['0', '0.002']) {
      const v = await filledDraft(tableId, DEMO.analyst, bump)
      expect((await analyst.post(`${base(v.number)}/submit`, {})).status).toBe(200)
      expect((await felix.post(`${base(v.number)}/approve`, {})).status).toBe(200)
    }
    const draft = await filledDraft(tableId, DEMO.analyst)
    type Body = { content: { version: { number: number, status: string }, points: [string, string][] } }
    const now = await (await read(`/api/v1/tables/${tableId}`)).json() as Body
    expect(now.content.version).toMatchObject({ number: 2, status: 'approved' })
    const then = await read(`/api/v1/tables/${tableId}?version=1`)
    expect(then.status).toBe(200)
    const old = await then.json() as Body
    expect(old.content.version).toMatchObject({ number: 1, status: 'retired' })
    expect(old.content.points[0]).toEqual(['60', '0.01'])
    expect((await read(`/api/v1/tables/${tableId}?version=${draft.number}`)).status).toBe(404)
    expect((await read(`/api/v1/tables/${tableId}?version=99`)).status).toBe(404)
    expect((await read(`/api/v1/tables/${tableId}?version=first`)).status).toBe(400)
  })

  it('answers 304 to a system that already holds the version (If-None-Match), counted apart from full reads', async () => {
    const tables = await (await read('/api/v1/tables')).json() as { id: string, name: string }[]
    const curve = tables.find(t => t.name === 'Discount curve 2026-09-30')!
    const first = await read(`/api/v1/tables/${curve.id}`)
    const tag = first.headers.get('etag')!
    expect(tag).toMatch(/^W\/"[0-9a-f]{64}"$/)
    const before = { reads: await usage('reads'), notModified: await usage('not_modified') }
    const again = await read(`/api/v1/tables/${curve.id}`, token, { 'if-none-match': tag })
    expect(again.status).toBe(304)
    expect(await again.text()).toBe('')
    expect({ reads: await usage('reads'), notModified: await usage('not_modified') }).toEqual({ reads: before.reads, notModified: before.notModified + 1 })
    expect((await read(`/api/v1/tables/${curve.id}`, token, { 'if-none-match': 'W/"something-else"' })).status).toBe(200)
    expect(await usage('reads')).toBe(before.reads + 1)
  })

  it('a token limited to some tables lists and reads only those; other tables answer 404', async () => {
    const ours = await admin.get<{ id: string, name: string }[]>(`/api/orgs/${LARKSPUR}/tables`)
    const curve = ours.body.find(t => t.name === 'Discount curve 2026-09-30')!
    const female = ours.body.find(t => t.name === 'Pensioner mortality, female')!
    const r = await admin.post<{ token: string, readToken: { tables: { id: string, name: string }[] | null } }>(`/api/orgs/${LARKSPUR}/read-tokens`, { name: 'Curve only', tables: [curve.id] })
    expect(r.status).toBe(201)
    expect(r.body.readToken.tables).toEqual([{ id: curve.id, name: curve.name }])
    const list = await (await read('/api/v1/tables', r.body.token)).json() as { name: string }[]
    expect(list.map(t => t.name)).toEqual(['Discount curve 2026-09-30'])
    expect((await read(`/api/v1/tables/${curve.id}`, r.body.token)).status).toBe(200)
    expect((await read(`/api/v1/tables/${curve.id.toUpperCase()}`, r.body.token)).status).toBe(200)
    expect((await read(`/api/v1/tables/${female.id}`, r.body.token)).status).toBe(404)
    expect((await read(`/api/v1/tables/${female.id}`)).status).toBe(200) // the unlimited token still reads it
    expect(await count(`SELECT 1 FROM audit_events WHERE action = 'read-token.create' AND detail->>'name' = 'Curve only' AND detail->'tables' @> '["Discount curve 2026-09-30"]'::jsonb`)).toBe(1)
  })

  it('refuses a limit naming another organisation\'s table, or no table at all', async () => {
    const fenwickAdmin = await signedIn(DEMO.otherAdmin)
    const theirs = await fenwickAdmin.get<{ id: string }[]>(`/api/orgs/${FENWICK}/tables`)
    const foreign = await admin.post<{ statusMessage: string }>(`/api/orgs/${LARKSPUR}/read-tokens`, { name: 'Sneaky', tables: [theirs.body[0]!.id] })
    expect(foreign.status).toBe(400)
    expect(foreign.body.statusMessage).toContain('not one of this organisation')
    expect((await admin.post(`/api/orgs/${LARKSPUR}/read-tokens`, { name: 'Empty', tables: [] })).status).toBe(400)
    expect(await count(`SELECT 1 FROM read_tokens WHERE name IN ('Sneaky', 'Empty')`)).toBe(0)
  })

  it('answers 429 with Retry-After once a token passes its requests per minute; other tokens go on', async () => {
    const r = await admin.post<{ token: string }>(`/api/orgs/${LARKSPUR}/read-tokens`, { name: 'Stuck in a loop' })
    // 300 a minute: 601 requests make at least one clock minute go over, even if they straddle two minutes
    let refused: Response | null = null
    for (let sent = 0; sent < 601 && !refused; sent += 10) {
      const batch = await Promise.all(Array.from({ length: 10 }, () => read('/api/v1/tables', r.body.token)))
      refused = batch.find(b => b.status === 429) ?? null
      expect(batch.every(b => b.status === 200 || b.status === 429)).toBe(true)
    }
    expect(refused).not.toBeNull()
    expect(Number(refused!.headers.get('retry-after'))).toBeGreaterThanOrEqual(1)
    expect(Number(refused!.headers.get('retry-after'))).toBeLessThanOrEqual(60)
    expect((await refused!.json() as { statusMessage: string }).statusMessage).toContain('more than 300 requests this minute')
    expect((await read('/api/v1/tables')).status).toBe(200)
  })

  it('stops answering a revoked token at once', async () => {
    const r = await admin.post<{ token: string, readToken: { id: string } }>(`/api/orgs/${LARKSPUR}/read-tokens`, { name: 'Short-lived' })
    expect((await read('/api/v1/tables', r.body.token)).status).toBe(200)
    expect((await admin.req('DELETE', `/api/orgs/${LARKSPUR}/read-tokens/${r.body.readToken.id}`)).status).toBe(200)
    expect((await read('/api/v1/tables', r.body.token)).status).toBe(401)
    expect((await admin.req('DELETE', `/api/orgs/${LARKSPUR}/read-tokens/${r.body.readToken.id}`)).status).toBe(404)
  })
})
