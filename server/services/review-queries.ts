import { QueryTypes } from 'sequelize'
import { can } from '#shared/permissions'
import type { PersonRef, ReviewQueueItemDto, ReviewStateDto, VersionCommentDto } from '#shared/types/review'
import type { OrgAccess } from '../utils/auth'
import { findVersion, type VersionRecord } from './tables'

type Row = Record<string, unknown>
const person = (r: Row, p: string): PersonRef | null => (r[`${p}_id`] ? { id: r[`${p}_id`] as string, name: r[`${p}_name`] as string, email: r[`${p}_email`] as string } : null)
const iso = (v: unknown) => (v ? new Date(v as string).toISOString() : null)
const join = (col: string, p: string) => `LEFT JOIN users ${p} ON ${p}.id = v.${col}`
const cols = (p: string) => `${p}.id AS ${p}_id, ${p}.name AS ${p}_name, ${p}.email AS ${p}_email`

/** Plain reasons a stale fill is refused (shown in the review panel too). */
export const STALE_FILL = {
  submit: 'The chosen fill was fitted on other points: the given points changed after the fill was chosen. Open the fill bench, compare on the current points and choose the fill again; then submit.',
  approve: 'The recorded fill was fitted on other points than the ones this version holds, so what you would sign is not what was checked. Send it back so the fill can be chosen again on the current points.',
} as const

/** Maker-checker: the people who made this version (author, filler, submitter) may not sign it off. */
export function makers(v: Pick<VersionRecord, 'authorId' | 'filledBy' | 'submittedBy'>): string[] {
  return [v.authorId, v.filledBy, v.submittedBy].filter((id): id is string => !!id)
}

export async function listComments(versionId: string): Promise<VersionCommentDto[]> {
  const rows = await useDb().query<Row>(`
    SELECT c.id, c.kind, c.body, c.created_at, a.id AS a_id, a.name AS a_name, a.email AS a_email
    FROM version_comments c LEFT JOIN users a ON a.id = c.author_id WHERE c.version_id = :versionId ORDER BY c.created_at, c.id`,
  { replacements: { versionId }, type: QueryTypes.SELECT })
  return rows.map(r => ({ id: r.id as string, kind: r.kind as VersionCommentDto['kind'], body: r.body as string, author: person(r, 'a'), createdAt: iso(r.created_at)! }))
}

export async function reviewState(access: OrgAccess, tableId: string, number: number): Promise<ReviewStateDto> {
  const v = await findVersion(access.org.id, tableId, number)
  const [r] = await useDb().query<Row>(`
    SELECT v.submitted_at, v.approved_at, v.retired_at, v.retire_reason, s2.number AS superseded_number,
           ${cols('au')}, ${cols('fb')}, ${cols('sb')}, ${cols('ab')}, ${cols('rb')}
    FROM table_versions v ${join('author_id', 'au')} ${join('filled_by', 'fb')} ${join('submitted_by', 'sb')} ${join('approved_by', 'ab')} ${join('retired_by', 'rb')}
    LEFT JOIN table_versions s2 ON s2.id = v.superseded_by WHERE v.id = :id`,
  { replacements: { id: v.id }, type: QueryTypes.SELECT })
  // what a sign-off or a withdrawal changes: the version in force now, and the connected systems that read this table
  const [reach] = await useDb().query<{ in_force: number | null; readers: number }>(`
    SELECT (SELECT number FROM table_versions WHERE table_id = :tableId AND status = 'approved' AND id <> :id) AS in_force,
           (SELECT count(*)::int FROM read_tokens WHERE org_id = :orgId AND revoked_at IS NULL AND (table_ids IS NULL OR :tableId = ANY(table_ids))) AS readers`,
  { replacements: { id: v.id, tableId: v.tableId, orgId: access.org.id }, type: QueryTypes.SELECT })
  const madeThis = makers(v).includes(access.user.id)
  const mayDecide = can(access.role, 'reviews:decide')
  return {
    versionId: v.id, tableName: v.tableName, number: v.number, status: v.status,
    inForce: reach?.in_force ?? null, connectedSystems: reach?.readers ?? 0, hasFill: v.hasFill, fillStale: v.hasFill && v.fillStale && (v.status === 'draft' || v.status === 'in-review'),
    author: person(r!, 'au'), filledBy: person(r!, 'fb'), submittedBy: person(r!, 'sb'), submittedAt: iso(r!.submitted_at),
    approvedBy: person(r!, 'ab'), approvedAt: iso(r!.approved_at), retiredBy: person(r!, 'rb'), retiredAt: iso(r!.retired_at),
    retireReason: (r!.retire_reason as string | null) ?? null, supersededBy: (r!.superseded_number as number | null) ?? null,
    comments: await listComments(v.id),
    you: {
      madeThis,
      canSubmit: can(access.role, 'reviews:submit') && v.status === 'draft' && v.hasFill && !v.fillStale,
      submitBlockedReason: v.status !== 'draft' ? null : !v.hasFill ? 'Record a fill on the fill bench before asking for a second check.' : v.fillStale ? STALE_FILL.submit : null,
      canDecide: mayDecide && v.status === 'in-review' && !madeThis,
      signOffBlockedReason: v.status === 'in-review' && v.hasFill && v.fillStale ? STALE_FILL.approve : null,
      canRetire: mayDecide && v.status === 'approved',
      canExport: can(access.role, 'exports:download') && (v.status === 'approved' || v.status === 'retired'),
      decideBlockedReason: v.status === 'in-review' && mayDecide && madeThis ? 'You made, filled or submitted this version, so another actuary must sign it off.' : null,
    },
  }
}

/** Versions awaiting a second check in one organisation, oldest first. */
export async function reviewQueue(access: OrgAccess): Promise<ReviewQueueItemDto[]> {
  const rows = await useDb().query<Row>(`
    SELECT v.id, v.number, v.table_id, rt.name AS table_name, v.submitted_at, v.filled_by, ${cols('sb')}, ${cols('au')}
    FROM table_versions v JOIN rate_tables rt ON rt.id = v.table_id ${join('submitted_by', 'sb')} ${join('author_id', 'au')}
    WHERE v.org_id = :orgId AND v.status = 'in-review' ORDER BY v.submitted_at NULLS FIRST, rt.name`,
  { replacements: { orgId: access.org.id }, type: QueryTypes.SELECT })
  return rows.map(r => ({
    tableId: r.table_id as string, tableName: r.table_name as string, versionId: r.id as string, number: r.number as number,
    submittedBy: person(r, 'sb'), submittedAt: iso(r.submitted_at), author: person(r, 'au'),
    yours: [r.au_id, r.sb_id, r.filled_by].includes(access.user.id),
  }))
}
