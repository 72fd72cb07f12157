import { QueryTypes, type Sequelize, type Transaction } from 'sequelize'
import { chainHash, type AuditContent } from '../lib/audit-chain'

/**
 * Appends one event to its chain (per organisation; org-less events form the system chain) under the chain's advisory
 * lock, held to the end of the transaction: the event gets the next number of its trail (seq, gapless) and links to the
 * hash of the one before.
 */
export async function appendAuditEvent(db: Sequelize, content: AuditContent, t: Transaction): Promise<void> {
  await db.query('SELECT pg_advisory_xact_lock(hashtext(:chain))', { replacements: { chain: content.orgId ?? 'system' }, transaction: t })
  const [last] = await db.query<{ hash: string, seq: string }>(
    `SELECT hash, seq FROM audit_events WHERE org_id ${content.orgId ? '= :org' : 'IS NULL'} ORDER BY seq DESC LIMIT 1`,
    { replacements: { org: content.orgId }, type: QueryTypes.SELECT, transaction: t })
  const prevHash = last?.hash ?? null
  await db.query(
    `INSERT INTO audit_events (org_id, actor_id, actor_email, action, object_type, object_id, outcome, request_id, ip, detail, at, prev_hash, hash, seq)
     VALUES (:orgId, :actorId, :actorEmail, :action, :objectType, :objectId, :outcome, :requestId, :ip, :detail::jsonb, :at, :prevHash, :hash, :seq)`,
    { replacements: { ...content, detail: JSON.stringify(content.detail), prevHash, hash: chainHash(prevHash, content), seq: Number(last?.seq ?? 0) + 1 }, transaction: t })
}
