import { QueryTypes } from 'sequelize'
import { firstBrokenLink, type ChainRow } from '../lib/audit-chain'
import type { AuditEventDto, AuditPageDto, AuditVerifyDto, ChainVerdictDto } from '#shared/types/audit'

// The organisation's audit trail (its own hash chain) plus the sign-ins of its members, which live in
// the org-less system chain and are shown labelled as such.
type Row = Record<string, unknown>
export interface AuditFilter { table?: string; person?: string; action?: string; from?: string; to?: string; page: number; pageSize: number }

const MEMBER_SIGNINS = `(e.org_id IS NULL AND e.action LIKE 'auth.%' AND (e.actor_id IN (SELECT user_id FROM memberships WHERE org_id = :orgId)
  OR e.detail->>'email' IN (SELECT u.email FROM memberships m JOIN users u ON u.id = m.user_id WHERE m.org_id = :orgId)))`

export async function listAudit(orgId: string, f: AuditFilter): Promise<AuditPageDto> {
  const where = [`(e.org_id = :orgId OR ${MEMBER_SIGNINS})`]
  if (f.table) where.push(`(e.object_id = :table OR e.detail->>'tableId' = :table)`)
  if (f.person) where.push('(e.actor_id::text = :person OR e.actor_email = :person)')
  if (f.action) where.push('e.action LIKE :actionPrefix')
  if (f.from) where.push('e.at >= :from::date')
  if (f.to) where.push('e.at < (:to::date + 1)')
  const replacements = { orgId, table: f.table, person: f.person, actionPrefix: `${f.action ?? ''}%`, from: f.from, to: f.to, limit: f.pageSize, offset: (f.page - 1) * f.pageSize }
  const sql = `FROM audit_events e LEFT JOIN users u ON u.id = e.actor_id WHERE ${where.join(' AND ')}`
  const [{ n }] = await useDb().query<{ n: number }>(`SELECT count(*)::int AS n ${sql}`, { replacements, type: QueryTypes.SELECT }) as [{ n: number }]
  const rows = await useDb().query<Row>(`SELECT e.*, u.name AS actor_name ${sql} ORDER BY e.at DESC, e.id DESC LIMIT :limit OFFSET :offset`, { replacements, type: QueryTypes.SELECT })
  const actions = await useDb().query<{ action: string }>(`SELECT DISTINCT e.action FROM audit_events e WHERE e.org_id = :orgId OR ${MEMBER_SIGNINS} ORDER BY 1`, { replacements: { orgId }, type: QueryTypes.SELECT })
  return {
    page: f.page, pageSize: f.pageSize, total: n, actions: actions.map(a => a.action),
    events: rows.map((r): AuditEventDto => ({
      id: String(r.id), chain: r.org_id ? 'org' : 'system', at: new Date(r.at as string).toISOString(),
      actor: { id: (r.actor_id as string | null) ?? null, email: (r.actor_email as string | null) ?? null, name: (r.actor_name as string | null) ?? null },
      action: r.action as string, objectType: (r.object_type as string | null) ?? null, objectId: (r.object_id as string | null) ?? null,
      outcome: r.outcome as AuditEventDto['outcome'], ip: (r.ip as string | null) ?? null, detail: (r.detail as Record<string, unknown>) ?? {}, hash: r.hash as string,
    })),
  }
}

function toChainRow(r: Row): ChainRow {
  return {
    id: String(r.id), prevHash: (r.prev_hash as string | null) ?? null, hash: r.hash as string,
    orgId: (r.org_id as string | null) ?? null, actorId: (r.actor_id as string | null) ?? null, actorEmail: (r.actor_email as string | null) ?? null,
    action: r.action as string, objectType: (r.object_type as string | null) ?? null, objectId: (r.object_id as string | null) ?? null,
    outcome: r.outcome as string, requestId: (r.request_id as string | null) ?? null, ip: (r.ip as string | null) ?? null,
    detail: (r.detail as Record<string, unknown>) ?? {}, at: new Date(r.at as string).toISOString(),
  }
}

async function verifyChain(chain: 'org' | 'system', orgId: string): Promise<ChainVerdictDto> {
  const rows = (await useDb().query<Row>(`SELECT * FROM audit_events WHERE org_id ${chain === 'org' ? '= :orgId' : 'IS NULL'} ORDER BY id`,
    { replacements: { orgId }, type: QueryTypes.SELECT })).map(toChainRow)
  const broken = firstBrokenLink(rows)
  const at = broken ? rows.find(r => r.id === broken.id)! : null
  return { chain, events: rows.length, intact: !broken, brokenAt: broken && at ? { id: broken.id, at: at.at, action: at.action, reason: broken.reason } : null }
}

/** Re-computes every hash of the organisation's chain and of the system chain (sign-ins); names the first broken link. */
export async function verifyAudit(orgId: string): Promise<AuditVerifyDto> {
  return { checkedAt: new Date().toISOString(), chains: [await verifyChain('org', orgId), await verifyChain('system', orgId)] }
}
