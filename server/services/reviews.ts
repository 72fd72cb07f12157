import type { H3Event } from 'h3'
import { QueryTypes, type Transaction } from 'sequelize'
import type { ReviewStateDto } from '#shared/types/review'
import type { CommentKind } from '#shared/types/review'
import type { ApiErrorCode } from '#shared/api-errors'
import type { OrgAccess } from '../utils/auth'
import { STALE_FILL, makers, reviewState } from './review-queries'
import { findTable, findVersion, type VersionRecord } from './tables'
import { activeSigningKey } from './signing-keys'
import { writeCheckpoint } from './audit-anchor'
import { notifyReviewDecided, notifyReviewRequested, type ReviewMailContext } from './review-mail'

// Maker-checker: submit (draft -> in-review), sign off (in-review -> approved, the previous approved
// version -> retired), send back (in-review -> draft) and withdraw (approved -> retired).

const conflict = (message: string, code: ApiErrorCode = 'wrong-state'): never => { throw apiError(409, code, message) }


/**
 * The database checks a fill at COMMIT for any code path (migration 0701); here it checks at the status change itself,
 * so a refusal is an error of that statement (rolled back like any other) rather than a failed COMMIT.
 */
const checkFillNow = (t: Transaction) => useDb().query('SET CONSTRAINTS table_versions_fill_current IMMEDIATE', { transaction: t })

/** The database's own refusal (migration 0701) as the same 409 the checks below give. */
function fillGuard(action: keyof typeof STALE_FILL) {
  return (error: unknown): never => {
    const constraint = (error as { original?: { constraint?: string } }).original?.constraint
    if (constraint === 'fill_stale') conflict(STALE_FILL[action], 'fill-stale')
    if (constraint === 'fill_missing') conflict('No fill is recorded for this version.', 'fill-missing')
    throw error
  }
}

async function addComment(t: Transaction, access: OrgAccess, versionId: string, kind: CommentKind, body: string) {
  await useDb().query('INSERT INTO version_comments (org_id, version_id, author_id, kind, body) VALUES (:org, :versionId, :author, :kind, :body)',
    { replacements: { org: access.org.id, versionId, author: access.user.id, kind, body }, transaction: t })
}

function mailContext(access: OrgAccess, v: VersionRecord): ReviewMailContext {
  return { orgId: access.org.id, orgSlug: access.org.slug, orgName: access.org.name, tableId: v.tableId, tableName: v.tableName, number: v.number, actorName: access.user.name }
}

const auditVersion = (event: H3Event, access: OrgAccess, v: VersionRecord, action: string, detail: Record<string, unknown>, t: Transaction) =>
  audit(event, { orgId: access.org.id, action, objectType: 'table_version', objectId: v.id, detail: { tableId: v.tableId, number: v.number, ...detail } }, t)

export async function submitForReview(event: H3Event, access: OrgAccess, tableId: string, number: number, note?: string): Promise<ReviewStateDto> {
  const v = await inTransaction(async (t) => {
    await checkFillNow(t)
    const v = await findVersion(access.org.id, tableId, number, { transaction: t, lock: true })
    if (v.status !== 'draft') conflict('Only a working draft can be submitted for a second check.')
    if (!v.hasFill) conflict('Record a fill for this draft first: a second check needs the chosen method and its filled values.', 'fill-missing')
    if (v.fillStale) conflict(STALE_FILL.submit, 'fill-stale')
    await useDb().query(`UPDATE table_versions SET status = 'in-review', submitted_by = :user, submitted_at = now(), lock_version = lock_version + 1, updated_at = now() WHERE id = :id`,
      { replacements: { user: access.user.id, id: v.id }, transaction: t })
    await addComment(t, access, v.id, 'submit', note || 'Submitted for a second check.')
    await auditVersion(event, access, v, 'version.submit', { note: note ?? null }, t)
    return { ...v, submittedBy: access.user.id }
  }).catch(fillGuard('submit'))
  await notifyReviewRequested(mailContext(access, v), makers(v), note)
  return reviewState(access, tableId, number)
}

/** Signs off someone else's version; refuses the caller's own work with 403 (also re-checked under the row lock). */
export async function approveVersion(event: H3Event, access: OrgAccess, tableId: string, number: number, comment?: string): Promise<ReviewStateDto> {
  const ownWork = () => apiError(403, 'own-work', 'You made, filled or submitted this version, so you cannot sign it off: another actuary must give the second check.')
  const before = await findVersion(access.org.id, tableId, number)
  if (makers(before).includes(access.user.id)) {
    await audit(event, { orgId: access.org.id, action: 'version.approve', outcome: 'denied', objectType: 'table_version', objectId: before.id, detail: { tableId, number, reason: 'own work' } })
    throw ownWork()
  }
  // the trail's head is signed at every sign-off (a checkpoint); the key is opened first, outside the trail's lock
  const key = await activeSigningKey(event, access.org.id)
  const v = await inTransaction(async (t) => {
    await checkFillNow(t)
    await findTable(access.org.id, tableId, { transaction: t, lock: true })
    const v = await findVersion(access.org.id, tableId, number, { transaction: t, lock: true })
    if (makers(v).includes(access.user.id)) throw ownWork()
    if (v.status !== 'in-review') conflict('Only a version awaiting a second check can be signed off.')
    if (!v.hasFill) conflict('This version has no recorded fill; send it back.', 'fill-missing')
    if (v.fillStale) conflict(STALE_FILL.approve, 'fill-stale')
    const previous = await useDb().query<{ id: string; number: number }>(`SELECT id, number FROM table_versions WHERE table_id = :tableId AND status = 'approved' AND id <> :id`,
      { replacements: { tableId, id: v.id }, type: QueryTypes.SELECT, transaction: t })
    await useDb().query(`UPDATE table_versions SET status = 'approved', approved_by = :user, approved_at = now(), updated_at = now() WHERE id = :id`,
      { replacements: { user: access.user.id, id: v.id }, transaction: t })
    for (const p of previous) {
      await useDb().query(`UPDATE table_versions SET status = 'retired', retired_by = :user, retired_at = now(), retire_reason = :reason, superseded_by = :id, updated_at = now() WHERE id = :prev`,
        { replacements: { user: access.user.id, reason: `Superseded by version ${v.number}.`, id: v.id, prev: p.id }, transaction: t })
      await audit(event, { orgId: access.org.id, action: 'version.supersede', objectType: 'table_version', objectId: p.id, detail: { tableId, number: p.number, supersededBy: v.number } }, t)
    }
    await addComment(t, access, v.id, 'approve', comment || 'Signed off.')
    await auditVersion(event, access, v, 'version.approve', { comment: comment ?? null, supersedes: previous.map(p => p.number) }, t)
    await writeCheckpoint(access.org, 'sign-off', key, t)
    return v
  }).catch(fillGuard('approve'))
  await notifyReviewDecided(mailContext(access, v), makers(v), 'approved', comment)
  return reviewState(access, tableId, number)
}

export async function sendBack(event: H3Event, access: OrgAccess, tableId: string, number: number, comment: string): Promise<ReviewStateDto> {
  const v = await inTransaction(async (t) => {
    const v = await findVersion(access.org.id, tableId, number, { transaction: t, lock: true })
    if (makers(v).includes(access.user.id)) throw apiError(403, 'own-work', 'You made this version: to change it yourself, ask a reviewer to send it back, or comment on it.')
    if (v.status !== 'in-review') conflict('Only a version awaiting a second check can be sent back.')
    await useDb().query(`UPDATE table_versions SET status = 'draft', submitted_by = NULL, submitted_at = NULL, lock_version = lock_version + 1, updated_at = now() WHERE id = :id`,
      { replacements: { id: v.id }, transaction: t })
    await addComment(t, access, v.id, 'send-back', comment)
    await auditVersion(event, access, v, 'version.send-back', { comment }, t)
    return v
  })
  await notifyReviewDecided(mailContext(access, v), makers(v), 'sent back', comment)
  return reviewState(access, tableId, number)
}

export async function retireVersion(event: H3Event, access: OrgAccess, tableId: string, number: number, reason: string): Promise<ReviewStateDto> {
  await inTransaction(async (t) => {
    const v = await findVersion(access.org.id, tableId, number, { transaction: t, lock: true })
    if (v.status !== 'approved') conflict('Only a signed-off version can be withdrawn.')
    await useDb().query(`UPDATE table_versions SET status = 'retired', retired_by = :user, retired_at = now(), retire_reason = :reason, updated_at = now() WHERE id = :id`,
      { replacements: { user: access.user.id, reason, id: v.id }, transaction: t })
    await addComment(t, access, v.id, 'retire', reason)
    await auditVersion(event, access, v, 'version.retire', { reason }, t)
  })
  return reviewState(access, tableId, number)
}

export async function commentOn(event: H3Event, access: OrgAccess, tableId: string, number: number, body: string): Promise<ReviewStateDto> {
  await inTransaction(async (t) => {
    const v = await findVersion(access.org.id, tableId, number, { transaction: t, lock: true })
    await addComment(t, access, v.id, 'comment', body)
    await auditVersion(event, access, v, 'version.comment', { length: body.length }, t)
  })
  return reviewState(access, tableId, number)
}
