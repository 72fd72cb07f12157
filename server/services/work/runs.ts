import { QueryTypes, type Transaction } from 'sequelize'
import type { ApiErrorCode } from '#shared/api-errors'
import type { RunDto, RunKind, RunStatus } from '#shared/types/runs'
import type { OrgAccess } from '../../utils/auth'
import { WORK } from './config'
import { enqueueRun } from './boss'
import { notifyRun } from './listener'

// The runs table (migration 0901) and every change to it. A run is changed only by the node that holds it (node and
// attempt both match), so a node that lost a run (it stalled, another took over) can no longer write anything to it.

export interface RunError { status: number, code: ApiErrorCode, message: string, extra?: Record<string, unknown> }
export interface ClaimedRun { id: string, orgId: string, userId: string, runKey: string, kind: RunKind, input: Record<string, unknown>, attempt: number }
export interface NewRun { kind: RunKind, runKey: string, heavy: boolean, input: Record<string, unknown>, bytes?: Buffer, total: number }

type Row = Record<string, unknown>
const claimedOf = (r: Row): ClaimedRun => ({ id: r.id as string, orgId: r.org_id as string, userId: r.user_id as string, runKey: r.run_key as string, kind: r.kind as RunKind, input: r.input as Record<string, unknown>, attempt: r.attempts as number })

/**
 * Records a run. A light one starts at once on this node (returned as claimed); a heavy one is queued for whichever node
 * has room. The same run id from the same person names the same run (a repeated request is not a second run).
 */
export async function createRun(access: OrgAccess, run: NewRun): Promise<{ id: string, claimed: ClaimedRun | null }> {
  return inTransaction(async (t) => {
    // bind parameters, not replacements: an upload's bytes go to PostgreSQL as they are, never escaped into the SQL text
    const [row] = await useDb().query<Row>(
      `INSERT INTO work_runs (org_id, user_id, run_key, kind, heavy, status, input, input_bytes, total, attempts, node, started_at, heartbeat_at)
       VALUES ($orgId, $userId, $runKey, $kind, $heavy, $status, $input::jsonb, $bytes, $total, $attempts, $node, $now, $now)
       ON CONFLICT (user_id, run_key) DO NOTHING RETURNING id, org_id, user_id, run_key, kind, input, attempts`,
      { bind: { orgId: access.org.id, userId: access.user.id, runKey: run.runKey, kind: run.kind, heavy: run.heavy, status: run.heavy ? 'queued' : 'running', input: JSON.stringify(run.input), bytes: run.bytes ?? null, total: run.total, attempts: run.heavy ? 0 : 1, node: run.heavy ? null : WORK.nodeId, now: run.heavy ? null : new Date() }, type: QueryTypes.SELECT, transaction: t })
    if (!row) {
      const [existing] = await useDb().query<{ id: string, kind: string }>('SELECT id, kind FROM work_runs WHERE user_id = :userId AND run_key = :runKey AND org_id = :orgId',
        { replacements: { userId: access.user.id, runKey: run.runKey, orgId: access.org.id }, type: QueryTypes.SELECT, transaction: t })
      if (!existing || existing.kind !== run.kind) throw apiError(409, 'invalid-input', 'This run id is already used for another run; start a new one.')
      return { id: existing.id, claimed: null }
    }
    if (run.heavy) await enqueueRun(row.id as string, t)
    return { id: row.id as string, claimed: run.heavy ? null : claimedOf(row) }
  })
}

/**
 * Takes a queued run for this node, unless its organisation already has WORK.orgLimit heavy runs running ('wait': it is
 * queued again a little later). null: the run is no longer waiting (finished, cancelled, or taken by another node).
 */
export async function claimRun(id: string): Promise<ClaimedRun | 'wait' | null> {
  return inTransaction(async (t) => {
    const [run] = await useDb().query<{ org_id: string, status: string }>('SELECT org_id, status FROM work_runs WHERE id = :id', { replacements: { id }, type: QueryTypes.SELECT, transaction: t })
    if (!run || run.status !== 'queued') return null
    // one claim at a time per organisation, so the count below is exact across nodes
    await useDb().query('SELECT pg_advisory_xact_lock(hashtext(:key))', { replacements: { key: `work-org:${run.org_id}` }, transaction: t })
    const [busy] = await useDb().query<{ n: number }>('SELECT count(*)::int AS n FROM work_runs WHERE org_id = :orgId AND status = \'running\' AND heavy',
      { replacements: { orgId: run.org_id }, type: QueryTypes.SELECT, transaction: t })
    if (busy!.n >= WORK.orgLimit) {
      await enqueueRun(id, t, 2)
      return 'wait'
    }
    const [row] = await useDb().query<Row>(
      `UPDATE work_runs SET status = 'running', node = :node, attempts = attempts + 1, started_at = now(), heartbeat_at = now()
       WHERE id = :id AND status = 'queued' RETURNING id, org_id, user_id, run_key, kind, input, attempts`, { replacements: { id, node: WORK.nodeId }, type: QueryTypes.SELECT, transaction: t })
    return row ? claimedOf(row) : null
  })
}

const mine = 'id = :id AND node = :node AND attempts = :attempt AND status = \'running\''

export async function reportProgress(run: ClaimedRun, done: number, total: number): Promise<void> {
  await useDb().query(`UPDATE work_runs SET done = :done, total = :total WHERE ${mine}`, { replacements: { id: run.id, node: WORK.nodeId, attempt: run.attempt, done, total } })
}

/** The run's input bytes (an upload), read by whichever node runs it. */
export async function runBytes(run: ClaimedRun): Promise<Buffer> {
  const [row] = await useDb().query<{ input_bytes: Buffer | null }>('SELECT input_bytes FROM work_runs WHERE id = :id', { replacements: { id: run.id }, type: QueryTypes.SELECT })
  if (!row?.input_bytes) throw new Error(`run ${run.id} has no input bytes`)
  return row.input_bytes
}

/**
 * Ends a run this node still holds; false when it no longer does (then nothing is written, and a caller that passed its
 * transaction must roll it back: the effects of a run and its end commit together or not at all).
 */
export type RunEnd = { status: 'done', result: string, bytes?: Buffer } | { status: 'failed', error: RunError } | { status: 'cancelled' }

export async function endRun(run: ClaimedRun, end: RunEnd, t?: Transaction): Promise<boolean> {
  // the result can be tens of MB of JSON text: a bind parameter, sent as it is
  const rows = await useDb().query(
    `UPDATE work_runs SET status = $status, result = $result, result_bytes = $bytes, error = $error::jsonb, done = CASE WHEN $status = 'done' THEN total ELSE done END,
       finished_at = now(), input_bytes = NULL
     WHERE id = $id AND node = $node AND attempts = $attempt AND status = 'running' RETURNING id`,
    { bind: { id: run.id, node: WORK.nodeId, attempt: run.attempt, status: end.status, result: end.status === 'done' ? end.result : null, bytes: end.status === 'done' ? end.bytes ?? null : null, error: end.status === 'failed' ? JSON.stringify(end.error) : null }, type: QueryTypes.SELECT, transaction: t })
  if (!rows.length) return false
  await notifyRun(run.id, end.status, t)
  return true
}

/** Asks for a run to stop: a queued one is cancelled at once, a running one by its node (told through NOTIFY). */
export async function cancelRun(id: string): Promise<RunStatus | null> {
  const [row] = await useDb().query<{ status: RunStatus }>(
    `UPDATE work_runs SET cancel_requested = true,
       status = CASE WHEN status = 'queued' THEN 'cancelled' ELSE status END,
       finished_at = CASE WHEN status = 'queued' THEN now() ELSE finished_at END
     WHERE id = :id AND status IN ('queued', 'running') RETURNING status`, { replacements: { id }, type: QueryTypes.SELECT })
  if (!row) return runStatusById(id) // already over: it stays as it ended
  await notifyRun(id, row.status === 'cancelled' ? 'cancelled' : 'cancel')
  return row.status
}

export interface RunRecord { dbId: string, dto: RunDto, error: RunError | null }

/** A run of the caller's, by the run id they chose; 404 for anyone else's, as if it did not exist. */
export async function findRun(access: OrgAccess, runKey: string): Promise<RunRecord> {
  const [r] = await useDb().query<Row>(
    `SELECT id, run_key, kind, status, done, total, attempts, error, created_at, started_at, finished_at FROM work_runs
     WHERE user_id = :userId AND org_id = :orgId AND run_key = :runKey`,
    { replacements: { userId: access.user.id, orgId: access.org.id, runKey }, type: QueryTypes.SELECT })
  if (!r) notFound('run (it may have ended over an hour ago)')
  const iso = (v: unknown) => (v ? new Date(v as string).toISOString() : null)
  const error = (r.error as RunError | null) ?? null
  return {
    dbId: r.id as string,
    error,
    dto: { id: r.run_key as string, kind: r.kind as RunKind, status: r.status as RunStatus, done: r.done as number, total: r.total as number, attempts: r.attempts as number,
      createdAt: iso(r.created_at)!, startedAt: iso(r.started_at), finishedAt: iso(r.finished_at), error: error ? { code: error.code, message: error.message } : null },
  }
}

export async function runStatusById(id: string): Promise<RunStatus | null> {
  const [row] = await useDb().query<{ status: RunStatus }>('SELECT status FROM work_runs WHERE id = :id', { replacements: { id }, type: QueryTypes.SELECT })
  return row?.status ?? null
}

export interface RunOutcome { status: RunStatus, result: string | null, result_bytes: Buffer | null, error: RunError | null }

/** The stored answer of a finished run (JSON text, and the file's bytes for an export), with its error when it failed. */
export async function runOutcome(id: string): Promise<RunOutcome> {
  const [row] = await useDb().query<RunOutcome>('SELECT status, result, result_bytes, error FROM work_runs WHERE id = :id', { replacements: { id }, type: QueryTypes.SELECT })
  if (!row) notFound('run')
  return row
}

/** The person who started a run, as an audit event names its actor. */
export async function runActor(run: ClaimedRun, t?: Transaction): Promise<{ id: string, email: string }> {
  const [row] = await useDb().query<{ email: string }>('SELECT email FROM users WHERE id = :id', { replacements: { id: run.userId }, type: QueryTypes.SELECT, transaction: t })
  return { id: run.userId, email: row!.email }
}
