import type { H3Event } from 'h3'
import { QueryTypes, Transaction } from 'sequelize'
import { isUuid } from '#shared/schemas/route-params'
import { runTask } from '../lib/work/pool'
import { pkcs8Of, signedContent, type OrgRef } from './exports'
import { activeSigningKey } from './signing-keys'
import { findTable } from './tables'

// The read API's answers, produced once and served as stored text (migration 0702). A signed-off version's points and
// fill never change, but its state (signed off, withdrawn), its table's details and the names of the people in it can:
// STAMP is a hash of exactly those, so a stored answer is used only while all of them are as they were when it was signed.
const STAMP = `md5(concat_ws(chr(31), v.status, t.name, t.kind, t.axis, t.axis_unit, t.value_unit, o.slug, o.name,
  au.name, au.email, fb.name, fb.email, sb.name, sb.email, ab.name, ab.email))`
const VERSION_ROW = `FROM table_versions v JOIN rate_tables t ON t.id = v.table_id JOIN organisations o ON o.id = v.org_id
  LEFT JOIN users au ON au.id = v.author_id LEFT JOIN users fb ON fb.id = v.filled_by
  LEFT JOIN users sb ON sb.id = v.submitted_by LEFT JOIN users ab ON ab.id = v.approved_by
  WHERE v.org_id = $orgId AND v.table_id = $tableId
    AND CASE WHEN $number::int IS NULL THEN v.status = 'approved' ELSE v.number = $number AND v.status IN ('approved', 'retired') END`

interface Found { id: string, number: number, stamp: string, kid: string | null, tag: string | null, body: string | null }

/**
 * The signed answer for a table's signed-off version (the one in force, or `number`), as JSON text, and its weak ETag;
 * body null when the caller already holds the tag (If-None-Match: answer 304). One statement finds the version, the
 * stored answer and counts the read for the token (per version and day: reads, or not-modified answers); only the first
 * read of a version (per key and stamp) signs, in a worker thread.
 */
export async function signedOffBody(event: H3Event, org: OrgRef, tableId: string, tokenId: string, options: { number?: number, holds?: string } = {}): Promise<{ tag: string, body: string | null }> {
  const held = (options.holds ?? '').split(',').map(t => t.trim()).filter(Boolean)
  if (!isUuid(tableId)) notFound('table')
  const [found] = await useDb().query<Found>(`
    WITH v AS (SELECT v.id, v.number, ${STAMP} AS stamp ${VERSION_ROW}),
      b AS (SELECT v.id, v.number, v.stamp, k.kid, s.tag, s.body FROM v
        LEFT JOIN org_signing_keys k ON k.org_id = $orgId AND k.status = 'active'
        LEFT JOIN signed_bodies s ON s.version_id = v.id AND s.key_id = k.kid AND s.stamp = v.stamp),
      used AS (INSERT INTO read_token_usage AS u (token_id, version_id, day, reads, not_modified)
        SELECT $tokenId, b.id, current_date, CASE WHEN b.tag = ANY($held::text[]) THEN 0 ELSE 1 END, CASE WHEN b.tag = ANY($held::text[]) THEN 1 ELSE 0 END FROM b
        ON CONFLICT (token_id, version_id, day) DO UPDATE SET reads = u.reads + excluded.reads, not_modified = u.not_modified + excluded.not_modified, last_at = now())
    SELECT id, number, stamp, kid, tag, CASE WHEN tag = ANY($held::text[]) THEN NULL ELSE body END AS body FROM b`,
  { bind: { orgId: org.id, tableId, number: options.number ?? null, tokenId, held }, type: QueryTypes.SELECT })
  if (!found) {
    await findTable(org.id, tableId) // 404 "no such table" first, as the table route always answered
    notFound(options.number === undefined ? 'signed-off version' : `signed-off version ${options.number}`)
  }
  if (found.tag && (found.body !== null || held.includes(found.tag))) return { tag: found.tag, body: found.body }
  const made = await produceBody(event, org, tableId, found.number)
  return { tag: made.tag, body: held.includes(made.tag) ? null : made.body }
}

/** Signs a version's answer once: content and stamp read in one snapshot; of two nodes signing at once, the first stored wins. */
async function produceBody(event: H3Event, org: OrgRef, tableId: string, number: number): Promise<{ tag: string, body: string }> {
  const key = await activeSigningKey(event, org.id)
  const db = useDb()
  const { content, stamp, versionId } = await db.transaction({ isolationLevel: Transaction.ISOLATION_LEVELS.REPEATABLE_READ, readOnly: true }, async (t) => {
    const [row] = await db.query<{ id: string, stamp: string }>(`SELECT v.id, ${STAMP} AS stamp ${VERSION_ROW}`, { bind: { orgId: org.id, tableId, number }, type: QueryTypes.SELECT, transaction: t })
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
