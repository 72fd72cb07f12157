import { QueryTypes } from 'sequelize'
import type { H3Event } from 'h3'
import { performance } from 'node:perf_hooks'
import type { GraduateRequest, GraduateResult } from '../engine/types'
import { runTask } from '../lib/work/pool'
import { pointsContentHash } from '../lib/points-hash'
import type { OrgAccess } from '../utils/auth'
import { checkValue } from '#shared/table-rules'
import { GRADUATED_KINDS, type GraduatedDraftInput, type GraduationSettings } from '#shared/schemas/graduation'
import type { GraduationPreviewDto } from '#shared/types/graduation'
import type { VersionDto } from '#shared/types/tables'
import { findTable, findVersion } from './tables'
import { insertPoints, readPoints } from './points-store'
import { withExperience } from './experience-store'
import { getVersion } from './versions'
import { engineFailure } from './engine-refusal'

// The graduate step: Whittaker-Henderson graduation of a version's crude rates, shown with its fit tests before anything
// is stored, then (on an explicit request with reasons) made a new working draft. The engine runs in the worker pool.

async function graduationOf(access: OrgAccess, tableId: string, number: number, input: GraduationSettings, signal?: AbortSignal) {
  const table = await findTable(access.org.id, tableId)
  if (table.shape === 'two-way') throw apiError(409, 'wrong-shape', 'Graduation works on one-way tables; a two-way table is filled on the two-way bench (a method per axis).')
  if (!GRADUATED_KINDS.includes(table.kind)) {
    throw apiError(400, 'not-graduated-kind', 'Graduation smooths rates estimated from experience (mortality, lapse, salary); a curve is not graduated.')
  }
  const version = await findVersion(access.org.id, tableId, number)
  const crude = await readPoints(version.id)
  const request: GraduateRequest = { points: await withExperience(tableId, crude), order: input.order, smoothing: input.smoothing, precision: input.digits, exposureType: input.exposureType }
  const started = performance.now()
  let result: GraduateResult
  try { result = await runTask('graduate', request, { signal }) }
  catch (error) { engineFailure(error) }
  return { table, version, crude, result, engineMs: performance.now() - started }
}

/** The graduation of the version's given points with its fit tests (read-only: any version). */
export async function previewGraduation(access: OrgAccess, tableId: string, number: number, input: GraduationSettings, signal?: AbortSignal): Promise<GraduationPreviewDto> {
  const g = await graduationOf(access, tableId, number, input, signal)
  return { result: g.result, crude: g.crude, withExposures: g.result.spec.weights === 'exposure' || g.result.spec.weights === 'mixed', withDeaths: g.result.diagnostics.chiSquare !== null, lockVersion: g.version.lockVersion, engineMs: g.engineMs }
}

/**
 * Makes the graduation a new working draft (number + 1), recording that it was graduated and how. Graduated from a working
 * draft, that draft is withdrawn in the same transaction (its crude values stay in the history, superseded by the new
 * draft); from a signed-off or withdrawn version, no version may be open. The graduation is recomputed here on the stored
 * points (values from the client are never taken) under the source's lock version.
 */
export async function makeGraduatedDraft(event: H3Event, access: OrgAccess, tableId: string, number: number, input: GraduatedDraftInput, signal?: AbortSignal): Promise<VersionDto> {
  const g = await graduationOf(access, tableId, number, input, signal)
  const points = g.result.points
  const bad = points.map(p => ({ p, rule: checkValue(g.table.kind, p.y) })).find(r => r.rule?.severity === 'error')
  if (bad) throw apiError(400, 'graduation-out-of-range', `The graduated value at ${bad.p.x} is ${bad.p.y}: ${bad.rule!.message}. Lower the smoothing or choose another order.`)
  const created = await inTransaction(async (t) => {
    await findTable(access.org.id, tableId, { transaction: t, lock: true })
    const source = await findVersion(access.org.id, tableId, number, { transaction: t, lock: true })
    if (source.lockVersion !== input.lockVersion || source.lockVersion !== g.version.lockVersion) {
      throw apiError(409, 'draft-conflict', `Version ${number} changed after you graduated it; graduate it again, then make the draft.`, { lockVersion: source.lockVersion })
    }
    if (source.status === 'in-review') throw apiError(409, 'wrong-state', 'This version awaits a second check; send it back first, or graduate another version.')
    const versions = await useDb().query<{ number: number, status: string }>('SELECT number, status FROM table_versions WHERE table_id = :tableId ORDER BY number', { replacements: { tableId }, type: QueryTypes.SELECT, transaction: t })
    const open = versions.find(v => v.number !== number && (v.status === 'draft' || v.status === 'in-review'))
    if (open) throw apiError(409, 'version-open', `Version ${open.number} is still open; finish or withdraw it before graduating into a new draft.`)
    const next = versions.at(-1)!.number + 1
    const graduation = { fromNumber: number, spec: g.result.spec, rationale: input.rationale, by: access.user.id, at: new Date().toISOString() }
    const [row] = await useDb().query<{ id: string }>(
      `INSERT INTO table_versions (org_id, table_id, number, status, author_id, notes, content_hash, graduation)
       VALUES (:orgId, :tableId, :next, 'draft', :author, :notes, :hash, :graduation::jsonb) RETURNING id`,
      { replacements: { orgId: access.org.id, tableId, next, author: access.user.id, hash: pointsContentHash(points), graduation: JSON.stringify(graduation),
        notes: `Graduated from version ${number} (Whittaker-Henderson, order ${input.order}, smoothing ${input.smoothing}).` }, type: QueryTypes.SELECT, transaction: t })
    await insertPoints(row!.id, points, t)
    if (source.status === 'draft') {
      const reason = `Replaced by version ${next}, its graduation.`
      await useDb().query(`UPDATE table_versions SET status = 'retired', retired_by = :userId, retired_at = now(), retire_reason = :reason, superseded_by = :newId, updated_at = now(), lock_version = lock_version + 1 WHERE id = :id`,
        { replacements: { id: source.id, userId: access.user.id, reason, newId: row!.id }, transaction: t })
      await audit(event, { orgId: access.org.id, action: 'version.retire', objectType: 'table_version', objectId: source.id, detail: { tableId, number, reason, supersededBy: next } }, t)
    }
    const s = g.result.spec
    await audit(event, {
      orgId: access.org.id, action: 'version.graduate', objectType: 'table_version', objectId: row!.id,
      detail: { tableId, number: next, from: number, order: s.order, smoothing: s.smoothing, weights: s.weights, precision: s.precision, engineVersion: s.engineVersion, points: points.length, rationale: input.rationale },
    }, t)
    return next
  })
  return getVersion(access.org.id, tableId, created)
}
