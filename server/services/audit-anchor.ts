import type { KeyObject } from 'node:crypto'
import { QueryTypes, type Transaction } from 'sequelize'
import { HEAD_FORMAT, canonicalBytes, signHead, type ChainHead, type HeadReason, type HeadStatement, type SignedHead } from '../lib/signing'
import { activeSigningKey } from './signing-keys'

// Anchors of an organisation's audit trail: its head signed with the organisation's key, carried by exports and
// read-API answers and stored as checkpoints (migration 0703) at least daily and on every sign-off.
export interface OrgRef { id: string; slug: string; name: string }
export interface OpenKey { kid: string; privateKey: KeyObject }
type Row = Record<string, unknown>

/** The newest event of the organisation's trail, or null for an empty trail. */
export async function chainHead(orgId: string, t?: Transaction): Promise<ChainHead | null> {
  const [row] = await useDb().query<Row>('SELECT id, seq, hash, at FROM audit_events WHERE org_id = :orgId ORDER BY seq DESC LIMIT 1',
    { replacements: { orgId }, type: QueryTypes.SELECT, transaction: t })
  return row ? { number: Number(row.seq), eventId: String(row.id), hash: row.hash as string, at: new Date(row.at as string).toISOString() } : null
}

/** What a signed head states: this organisation's trail ends at `head`, now. */
export function headStatement(org: OrgRef, reason: HeadReason, key: { kid: string }, head: ChainHead | null): HeadStatement {
  return { format: HEAD_FORMAT, organisation: { slug: org.slug, name: org.name }, head, statedAt: new Date().toISOString(), reason, keyId: key.kid }
}

/** The head now, signed. Inside a transaction that holds the trail's lock (after an audit event), it is that head. */
export async function signedHead(org: OrgRef, reason: HeadReason, key: OpenKey, t?: Transaction): Promise<SignedHead> {
  return signHead(headStatement(org, reason, key, await chainHead(org.id, t)), key.privateKey)
}

/** Stores a signed checkpoint; a daily one at most once per organisation and UTC day, whichever app node comes first. */
export async function writeCheckpoint(org: OrgRef, reason: 'daily' | 'sign-off', key: OpenKey, t: Transaction): Promise<void> {
  await useDb().query('SELECT pg_advisory_xact_lock(hashtext(:chain))', { replacements: { chain: org.id }, transaction: t })
  const { statement, signature } = await signedHead(org, reason, key, t)
  await useDb().query(`INSERT INTO audit_checkpoints (org_id, reason, day, head_seq, head_event_id, head_hash, head_at, statement, signature, key_id)
    VALUES (:orgId, :reason, (:statedAt::timestamptz AT TIME ZONE 'UTC')::date, :seq, :eventId, :hash, :at, :statement, :signature, :kid)
    ${reason === 'daily' ? 'ON CONFLICT (org_id, day) WHERE reason = \'daily\' DO NOTHING' : ''}`, {
    replacements: {
      orgId: org.id, reason, statedAt: statement.statedAt, seq: statement.head?.number ?? null, eventId: statement.head?.eventId ?? null,
      hash: statement.head?.hash ?? null, at: statement.head?.at ?? null, statement: canonicalBytes(statement).toString('utf8'), signature, kid: key.kid,
    },
    transaction: t,
  })
}

/** Writes today's checkpoint if the organisation has none yet (lazily, on the first audit read of a UTC day). */
export async function ensureDailyCheckpoint(org: OrgRef): Promise<void> {
  const [done] = await useDb().query<Row>(`SELECT 1 FROM audit_checkpoints WHERE org_id = :orgId AND reason = 'daily' AND day = (now() AT TIME ZONE 'UTC')::date`,
    { replacements: { orgId: org.id }, type: QueryTypes.SELECT })
  if (done) return
  let key: OpenKey
  try { key = await activeSigningKey(null, org.id) } catch (error) {
    // a server without a signing secret (NUXT_SIGNING_SECRET) cannot sign checkpoints; reading the trail still works
    if ((error as { statusCode?: number }).statusCode === 503) return
    throw error
  }
  await inTransaction(t => writeCheckpoint(org, 'daily', key, t))
}

/** For the server's timer: today's checkpoint of every organisation whose trail grew since its last one. */
export async function writeDueCheckpoints(): Promise<number> {
  const due = await useDb().query<OrgRef>(`
    SELECT o.id, o.slug, o.name FROM organisations o
    WHERE NOT EXISTS (SELECT 1 FROM audit_checkpoints c WHERE c.org_id = o.id AND c.reason = 'daily' AND c.day = (now() AT TIME ZONE 'UTC')::date)
      AND EXISTS (SELECT 1 FROM audit_events e WHERE e.org_id = o.id
                  AND e.seq > coalesce((SELECT max(c.head_seq) FROM audit_checkpoints c WHERE c.org_id = o.id), 0))`, { type: QueryTypes.SELECT })
  for (const org of due) await ensureDailyCheckpoint(org)
  return due.length
}

export interface StoredCheckpoint { id: string; reason: string; statement: string; signature: string; keyId: string; createdAt: string }

/** Every checkpoint of the organisation, oldest first, as stored (statement text as signed). */
export async function listCheckpoints(orgId: string): Promise<StoredCheckpoint[]> {
  const rows = await useDb().query<Row>('SELECT id, reason, statement, signature, key_id, created_at FROM audit_checkpoints WHERE org_id = :orgId ORDER BY id',
    { replacements: { orgId }, type: QueryTypes.SELECT })
  return rows.map(r => ({ id: String(r.id), reason: r.reason as string, statement: r.statement as string, signature: r.signature as string, keyId: r.key_id as string, createdAt: new Date(r.created_at as string).toISOString() }))
}
