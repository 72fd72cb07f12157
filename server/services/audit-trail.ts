import { QueryTypes } from 'sequelize'
import { canonicalJson } from '../lib/canonical-json'
import type { AuditContent } from '../lib/audit-chain'
import { METHODS } from '../engine/index'
import { describeAuditEvent, type AuditNames } from '#shared/audit-words'
import type { AuditEventDto, AuditPageDto } from '#shared/types/audit'

// The organisation's audit trail (its own hash chain) plus the sign-ins of its members, which live in the org-less
// system chain and are shown labelled as such. Each event reads as a sentence with names.
type Row = Record<string, unknown>
export interface AuditFilter { table?: string; person?: string; action?: string; from?: string; to?: string; offset?: number; page: number; pageSize: number }

const MEMBER_SIGNINS = `(e.org_id IS NULL AND e.action LIKE 'auth.%' AND (e.actor_id IN (SELECT user_id FROM memberships WHERE org_id = :orgId)
  OR e.detail->>'email' IN (SELECT u.email FROM memberships m JOIN users u ON u.id = m.user_id WHERE m.org_id = :orgId)))`

function whereOf(orgId: string, f: Omit<AuditFilter, 'page' | 'pageSize'>) {
  const where = [`(e.org_id = :orgId OR ${MEMBER_SIGNINS})`]
  if (f.table) where.push(`(e.object_id = :table OR e.detail->>'tableId' = :table)`)
  if (f.person) where.push('(e.actor_id::text = :person OR e.actor_email = :person)')
  if (f.action) where.push('e.action LIKE :actionPrefix')
  // days are the reader's days: from local midnight (offset: minutes east of UTC) to the end of the "to" day
  if (f.from) where.push(`e.at >= (:from::date)::timestamp AT TIME ZONE 'UTC' - make_interval(mins => :tzMinutes)`)
  if (f.to) where.push(`e.at < (:to::date + 1)::timestamp AT TIME ZONE 'UTC' - make_interval(mins => :tzMinutes)`)
  const replacements = { orgId, table: f.table, person: f.person, actionPrefix: `${f.action ?? ''}%`, from: f.from, to: f.to, tzMinutes: f.offset ?? 0 }
  return { sql: `FROM audit_events e LEFT JOIN users u ON u.id = e.actor_id WHERE ${where.join(' AND ')}`, replacements }
}

/** Names of the tables and people the events mention, in two queries. */
async function namesFor(orgId: string, rows: Row[]): Promise<AuditNames> {
  const tableIds = new Set<string>()
  const userIds = new Set<string>()
  for (const r of rows) {
    const d = (r.detail ?? {}) as Record<string, unknown>
    if (typeof d.tableId === 'string') tableIds.add(d.tableId)
    if (Array.isArray(d.tables)) d.tables.forEach(t => typeof t === 'string' && tableIds.add(t))
    if (r.object_type === 'rate_table') tableIds.add(r.object_id as string)
    if (r.object_type === 'user') userIds.add(r.object_id as string)
  }
  const uuid = (s: string) => /^[0-9a-f-]{36}$/i.test(s)
  const tables = tableIds.size ? await useDb().query<{ id: string; name: string }>('SELECT id::text, name FROM rate_tables WHERE org_id = :orgId AND id IN (:ids)',
    { replacements: { orgId, ids: [...tableIds].filter(uuid) }, type: QueryTypes.SELECT }) : []
  const people = userIds.size ? await useDb().query<{ id: string; name: string }>('SELECT id::text, name FROM users WHERE id IN (:ids)',
    { replacements: { ids: [...userIds].filter(uuid) }, type: QueryTypes.SELECT }) : []
  const t = new Map(tables.map(r => [r.id, r.name]))
  const p = new Map(people.map(r => [r.id, r.name]))
  return { table: id => t.get(id) ?? null, person: id => p.get(id) ?? null }
}

export function toContent(r: Row): AuditContent {
  return {
    orgId: (r.org_id as string | null) ?? null, actorId: (r.actor_id as string | null) ?? null, actorEmail: (r.actor_email as string | null) ?? null,
    action: r.action as string, objectType: (r.object_type as string | null) ?? null, objectId: (r.object_id as string | null) ?? null,
    outcome: r.outcome as string, requestId: (r.request_id as string | null) ?? null, ip: (r.ip as string | null) ?? null,
    detail: (r.detail as Record<string, unknown>) ?? {}, at: new Date(r.at as string).toISOString(),
  }
}

function toDto(r: Row, names: AuditNames): AuditEventDto {
  const c = toContent(r)
  return {
    id: String(r.id), number: Number(r.seq), chain: c.orgId ? 'org' : 'system', at: c.at,
    actor: { id: c.actorId, email: c.actorEmail, name: (r.actor_name as string | null) ?? null },
    action: c.action, sentence: describeAuditEvent({ ...c, outcome: c.outcome as AuditEventDto['outcome'] }, names, METHODS),
    objectType: c.objectType, objectId: c.objectId, outcome: c.outcome as AuditEventDto['outcome'], ip: c.ip, hash: r.hash as string,
  }
}

export async function listAudit(orgId: string, f: AuditFilter): Promise<AuditPageDto> {
  const { sql, replacements } = whereOf(orgId, f)
  const [{ n }] = await useDb().query<{ n: number }>(`SELECT count(*)::int AS n ${sql}`, { replacements, type: QueryTypes.SELECT }) as [{ n: number }]
  const rows = await useDb().query<Row>(`SELECT e.*, u.name AS actor_name ${sql} ORDER BY e.at DESC, e.id DESC LIMIT :limit OFFSET :offset`,
    { replacements: { ...replacements, limit: f.pageSize, offset: (f.page - 1) * f.pageSize }, type: QueryTypes.SELECT })
  const actions = await useDb().query<{ action: string }>(`SELECT DISTINCT e.action FROM audit_events e WHERE e.org_id = :orgId OR ${MEMBER_SIGNINS} ORDER BY 1`, { replacements: { orgId }, type: QueryTypes.SELECT })
  const names = await namesFor(orgId, rows)
  return { page: f.page, pageSize: f.pageSize, total: n, actions: actions.map(a => a.action), events: rows.map(r => toDto(r, names)) }
}

export interface AuditCsvRow extends AuditEventDto { prevHash: string | null; record: string }

/** Every event the filters select, oldest first, with what its hash covers (RFC 8785 JSON) for an offline check. */
export async function auditForCsv(orgId: string, f: Omit<AuditFilter, 'page' | 'pageSize'>): Promise<AuditCsvRow[]> {
  const { sql, replacements } = whereOf(orgId, f)
  const rows = await useDb().query<Row>(`SELECT e.*, u.name AS actor_name ${sql} ORDER BY e.org_id NULLS LAST, e.seq LIMIT 200000`, { replacements, type: QueryTypes.SELECT })
  const names = await namesFor(orgId, rows)
  return rows.map(r => ({ ...toDto(r, names), prevHash: (r.prev_hash as string | null) ?? null, record: canonicalJson(toContent(r)) }))
}
