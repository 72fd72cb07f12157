import { QueryTypes, type Sequelize, type Transaction } from 'sequelize'
import { chainHash, type AuditContent } from '../lib/audit-chain'

/** Appends one event to its chain (per organisation; org-less events form the system chain). */
export async function appendAuditEvent(db: Sequelize, content: AuditContent, t: Transaction): Promise<void> {
  await db.query('SELECT pg_advisory_xact_lock(hashtext(:chain))', { replacements: { chain: content.orgId ?? 'system' }, transaction: t })
  const [last] = await db.query<{ hash: string }>(
    `SELECT hash FROM audit_events WHERE org_id ${content.orgId ? '= :org' : 'IS NULL'} ORDER BY id DESC LIMIT 1`,
    { replacements: { org: content.orgId }, type: QueryTypes.SELECT, transaction: t })
  const prevHash = last?.hash ?? null
  await db.query(
    `INSERT INTO audit_events (org_id, actor_id, actor_email, action, object_type, object_id, outcome, request_id, ip, detail, at, prev_hash, hash)
     VALUES (:orgId, :actorId, :actorEmail, :action, :objectType, :objectId, :outcome, :requestId, :ip, :detail::jsonb, :at, :prevHash, :hash)`,
    { replacements: { ...content, detail: JSON.stringify(content.detail), prevHash, hash: chainHash(prevHash, content) }, transaction: t })
}
