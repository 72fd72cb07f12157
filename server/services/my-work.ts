import { QueryTypes } from 'sequelize'
import type { OrgAccess } from '../utils/auth'
import type { MySubmissionDto, MyUploadDto } from '#shared/types/my-work'
import { importDto, type ImportRow } from './work/kinds/import-read'

// The caller's own work in one organisation: uploads not yet made into tables, and versions they submitted.

/** The caller's unexpired uploads here, newest first (a created upload is deleted, so every row is unfinished). */
export async function listMyUploads(access: OrgAccess): Promise<MyUploadDto[]> {
  const rows = await useDb().query<ImportRow>(
    `SELECT id, file_name, file_kind, size_bytes, sheet_summary, created_at, expires_at FROM imports
     WHERE org_id = :orgId AND owner_id = :ownerId AND expires_at > now() ORDER BY created_at DESC LIMIT 100`,
    { replacements: { orgId: access.org.id, ownerId: access.user.id }, type: QueryTypes.SELECT })
  return rows.map(importDto)
}

interface SubmissionRow { table_id: string, table_name: string, number: number, status: MySubmissionDto['status'], submitted_at: string, decided_at: string | null, reason: string | null }

/** Versions whose latest submission (the 'submit' entry of their comment thread) the caller made, newest first. */
export async function listMySubmissions(access: OrgAccess): Promise<MySubmissionDto[]> {
  const rows = await useDb().query<SubmissionRow>(`
    WITH submits AS (
      SELECT DISTINCT ON (c.version_id) c.version_id, c.author_id, c.created_at
      FROM version_comments c WHERE c.org_id = :orgId AND c.kind = 'submit' ORDER BY c.version_id, c.created_at DESC
    )
    SELECT v.table_id, rt.name AS table_name, v.number, v.status, s.created_at AS submitted_at,
      d.created_at AS decided_at, CASE WHEN d.kind = 'send-back' THEN d.body END AS reason
    FROM submits s JOIN table_versions v ON v.id = s.version_id AND v.org_id = :orgId JOIN rate_tables rt ON rt.id = v.table_id
    LEFT JOIN LATERAL (
      SELECT c.kind, c.body, c.created_at FROM version_comments c
      WHERE c.version_id = v.id AND c.kind IN ('send-back', 'approve') AND c.created_at >= s.created_at ORDER BY c.created_at DESC LIMIT 1
    ) d ON true
    WHERE s.author_id = :userId ORDER BY s.created_at DESC LIMIT 200`,
  { replacements: { orgId: access.org.id, userId: access.user.id }, type: QueryTypes.SELECT })
  return rows.map(r => ({
    tableId: r.table_id, tableName: r.table_name, number: r.number, status: r.status,
    outcome: r.status === 'in-review' ? 'awaiting' : r.status === 'draft' ? 'sent-back' : 'signed-off',
    submittedAt: new Date(r.submitted_at).toISOString(), decidedAt: r.decided_at ? new Date(r.decided_at).toISOString() : null, reason: r.reason,
  }))
}
