import type { H3Event } from 'h3'
import { QueryTypes, Transaction } from 'sequelize'
import { isUuid } from '#shared/schemas/route-params'
import { runTask } from '../lib/work/pool'
import { pkcs8Of, signedContent } from './exports'
import { READ_REQUESTS_PER_MINUTE, tokenAccess, touchTokenSql, bearerHash, type ReadAccess } from './read-tokens'
import { signHead, type SignedHead } from '../lib/signing'
import { activeSigningKey, openSealedKey } from './signing-keys'
import { headStatement, signedHead } from './audit-anchor'
import { findTable } from './tables'

// The read API's answers, produced once and served as stored text (migration 0902). A signed-off version's points and
// fill never change, but its state (signed off, withdrawn), its table's details and the names of the people in it can:
// STAMP is a hash of exactly those, so a stored answer is used only while all of them are as they were when it was signed.
const STAMP = `md5(concat_ws(chr(31), v.status, t.name, t.kind, t.axis, t.axis_unit, t.value_unit, o.slug, o.name,
  au.name, au.email, fb.name, fb.email, sb.name, sb.email, ab.name, ab.email))`
const VERSION_JOINS = `JOIN rate_tables t ON t.id = v.table_id JOIN organisations o ON o.id = v.org_id
  LEFT JOIN users au ON au.id = v.author_id LEFT JOIN users fb ON fb.id = v.filled_by
  LEFT JOIN users sb ON sb.id = v.submitted_by LEFT JOIN users ab ON ab.id = v.approved_by`
/** The version in force (number null), or that number if it was ever signed off. */
const signedOff = (number: string) => `CASE WHEN ${number}::int IS NULL THEN v.status = 'approved' ELSE v.number = ${number} AND v.status IN ('approved', 'retired') END`

/**
 * The table route's one statement: checks and counts the token ($1, its hash), finds the version ($2 table, $3 number),
 * its stored answer under the active key and the current stamp, and counts the read for the token, version and day
 * (a 304 when the caller holds the tag, $4). Past the rate limit ($5) it finds no version and counts nothing.
 */
const READ_SQL = `
WITH tok AS (${touchTokenSql('$1')}),
  v AS (SELECT v.id, v.number, ${STAMP} AS stamp FROM tok JOIN table_versions v ON v.org_id = tok.org_id ${VERSION_JOINS}
    WHERE tok.window_count <= $5 AND (tok.table_ids IS NULL OR $2 = ANY(tok.table_ids)) AND v.table_id = $2::uuid AND ${signedOff('$3')}),
  b AS (SELECT v.id, v.number, v.stamp, k.kid, k.private_sealed, s.tag, s.body FROM v
    LEFT JOIN org_signing_keys k ON k.org_id = (SELECT org_id FROM tok) AND k.status = 'active'
    LEFT JOIN signed_bodies s ON s.version_id = v.id AND s.key_id = k.kid AND s.stamp = v.stamp),
  used AS (INSERT INTO read_token_usage AS u (token_id, version_id, day, reads, not_modified)
    SELECT (SELECT id FROM tok), b.id, current_date, CASE WHEN b.tag = ANY($4::text[]) THEN 0 ELSE 1 END, CASE WHEN b.tag = ANY($4::text[]) THEN 1 ELSE 0 END FROM b
    ON CONFLICT (token_id, version_id, day) DO UPDATE SET reads = u.reads + excluded.reads, not_modified = u.not_modified + excluded.not_modified, last_at = now())
SELECT tok.*, b.id AS version_id, b.number, b.tag, CASE WHEN b.tag = ANY($4::text[]) THEN NULL ELSE b.body END AS body,
  b.kid, b.private_sealed, h.id AS head_id, h.seq AS head_seq, h.hash AS head_hash, h.at AS head_at
FROM tok LEFT JOIN b ON true
  LEFT JOIN LATERAL (SELECT e.id, e.seq, e.hash, e.at FROM audit_events e WHERE e.org_id = tok.org_id ORDER BY e.seq DESC LIMIT 1) h ON b.body IS NOT NULL`

type Row = Record<string, unknown>

/**
 * The signed answer for a table's signed-off version (the one in force, or `number`) as JSON text, with its weak ETag;
 * body null when the caller already holds the tag (If-None-Match: answer 304). One statement on the hot path (token,
 * rate limit, version, stored answer, use count); only the first read of a version under a key and stamp signs, in a
 * worker thread. 401 / 429 as requireReadToken; 404 for a table outside the token's limit, another organisation's or
 * one without a signed-off version.
 */
export async function readSignedTable(event: H3Event, tableId: string, options: { number?: number, holds?: string } = {}): Promise<{ access: ReadAccess, tag: string, body: string | null }> {
  const held = (options.holds ?? '').split(',').map(t => t.trim()).filter(Boolean)
  const hash = bearerHash(event)
  const table = isUuid(tableId) ? tableId.toLowerCase() : null
  const { rows } = hash
    ? await useRawPool().query<Row>({ name: 'kw-read-signed-table', text: READ_SQL, values: [hash, table, options.number ?? null, held, READ_REQUESTS_PER_MINUTE] })
    : { rows: [] as Row[] }
  const access = tokenAccess(event, rows[0])
  const row = rows[0]!
  if (!table || (access.tableIds && !access.tableIds.includes(table))) notFound('table') // outside the token's tables: as if absent
  if (!row.version_id) {
    await findTable(access.org.id, table) // "no such table" first, as the route always answered
    notFound(options.number === undefined ? 'signed-off version' : `signed-off version ${options.number}`)
  }
  const tag = row.tag as string | null
  if (tag && held.includes(tag)) return { access, tag, body: null }
  if (tag && row.body !== null) {
    const key = { kid: row.kid as string, privateKey: openSealedKey(access.org.id, row.kid as string, row.private_sealed as string) }
    const head = row.head_id ? { number: Number(row.head_seq), eventId: String(row.head_id), hash: row.head_hash as string, at: new Date(row.head_at as string).toISOString() } : null
    return { access, tag, body: withAuditHead(row.body as string, signHead(headStatement(access.org, 'read-api', key, head), key.privateKey)) }
  }
  const made = await produceBody(event, access.org, table, row.number as number)
  if (held.includes(made.tag)) return { access, tag: made.tag, body: null }
  const key = await activeSigningKey(event, access.org.id)
  return { access, tag: made.tag, body: withAuditHead(made.body, await signedHead(access.org, 'read-api', key)) }
}

/**
 * The stored answer with the audit trail's head now, signed on its own beside the content (issue 11: removing the newest
 * events shows against it). The stored part stays byte for byte as signed; the head is per answer.
 */
function withAuditHead(body: string, head: SignedHead): string {
  return `${body.slice(0, body.lastIndexOf('}'))},"auditHead":${JSON.stringify(head)}}`
}

/** Signs a version's answer once: content and stamp read in one snapshot; of two nodes signing at once, the first stored wins. */
async function produceBody(event: H3Event, org: ReadAccess['org'], tableId: string, number: number): Promise<{ tag: string, body: string }> {
  const key = await activeSigningKey(event, org.id)
  const db = useDb()
  const { content, stamp, versionId } = await db.transaction({ isolationLevel: Transaction.ISOLATION_LEVELS.REPEATABLE_READ, readOnly: true }, async (t) => {
    const [row] = await db.query<{ id: string, stamp: string }>(`SELECT v.id, ${STAMP} AS stamp FROM table_versions v ${VERSION_JOINS}
      WHERE v.org_id = $orgId AND v.table_id = $tableId AND ${signedOff('$number')}`, { bind: { orgId: org.id, tableId, number }, type: QueryTypes.SELECT, transaction: t })
    if (!row) notFound(`signed-off version ${number}`)
    return { content: await signedContent(org, tableId, number, key.kid, t), stamp: row.stamp, versionId: row.id }
  })
  const signed = await runTask('signBody', { content, pkcs8: pkcs8Of(key.privateKey) })
  const ids = { versionId, kid: key.kid, stamp }
  await db.query(`INSERT INTO signed_bodies (version_id, key_id, stamp, tag, body) VALUES ($versionId, $kid, $stamp, $tag, $body)
    ON CONFLICT (version_id, key_id, stamp) DO NOTHING`, { bind: { ...ids, tag: signed.tag, body: signed.body } })
  // a statement of its own, so it sees the answer another node stored first
  const [kept] = await db.query<{ tag: string, body: string }>('SELECT tag, body FROM signed_bodies WHERE version_id = $versionId AND key_id = $kid AND stamp = $stamp',
    { bind: ids, type: QueryTypes.SELECT })
  return kept ?? signed
}
