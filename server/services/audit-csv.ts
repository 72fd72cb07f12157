import { csvText, type CsvCell } from '../lib/csv'
import { auditActionLabel } from '#shared/audit-actions'
import { formatUtc } from '#shared/plain-text'
import { auditForCsv, type AuditFilter } from './audit-trail'
import type { OrgRef } from './audit-anchor'

// The audit trail as CSV: one row per event, oldest first per trail, with the words a reader reads and what a re-check
// needs: the event's hash, the hash before it, and the exact record the hash covers (RFC 8785 JSON). A check recomputes
// SHA-256(previous hash or "genesis" + "\n" + record) for every row (scripts/verify-audit-csv.ts, docs/audit-trail.md).
export const AUDIT_CSV_HEADER = ['Number', 'Trail', 'When (UTC)', 'Who', 'E-mail', 'What happened', 'Action', 'Outcome', 'Hash', 'Previous hash', 'Hashed record (RFC 8785 JSON)']

export async function auditCsv(org: OrgRef, filter: Omit<AuditFilter, 'page' | 'pageSize'>): Promise<{ fileName: string; text: string }> {
  const rows = await auditForCsv(org.id, filter)
  const body = rows.map((e): CsvCell[] => [
    e.number, e.chain === 'org' ? org.name : 'System (sign-ins)', formatUtc(e.at), e.actor.name ?? (e.actor.email ? 'former member' : 'system'), e.actor.email,
    e.sentence, `${auditActionLabel(e.action)} (${e.action})`, e.outcome, e.hash, e.prevHash ?? 'genesis', e.record,
  ])
  return { fileName: `${org.slug}-audit-trail-${new Date().toISOString().slice(0, 10)}.csv`, text: csvText([AUDIT_CSV_HEADER, ...body]) }
}
