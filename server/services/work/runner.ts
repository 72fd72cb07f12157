import type PgBoss from 'pg-boss'
import { QueryTypes } from 'sequelize'
import { WORK_QUEUE } from '../../lib/work/queue'
import { WORK } from './config'
import { enqueueRun, stopBoss, useBoss } from './boss'
import { notifyRun, onRunEvent, startListener, stopListener } from './listener'
import { claimRun, endRun, reportProgress, type ClaimedRun } from './runs'
import { runErrorOf } from './errors'
import { RUN_KINDS } from './kinds/index'

// This node's part in the runs: takes queued runs (as many at once as WORK.slots), runs them in the worker pool, writes a
// heartbeat for each one it holds, and takes over runs whose node went quiet. Started by server/plugins/runs.ts.

interface Held { run: ClaimedRun, controller: AbortController, cancelled: boolean, since: number }
const held = new Map<string, Held>()
const workerIds: string[] = []
const timers: ReturnType<typeof setInterval>[] = []
let started: Promise<void> | undefined

class RunLost extends Error {}

/** Runs a claimed run to its end: its result (and any effects) commit with its end, or not at all. */
export async function executeRun(run: ClaimedRun): Promise<void> {
  const entry: Held = { run, controller: new AbortController(), cancelled: false, since: Date.now() }
  held.set(run.id, entry)
  const off = onRunEvent(run.id, (what) => { if (what === 'cancel') stop(entry, true) })
  try {
    const commit = await RUN_KINDS[run.kind]({ run, signal: entry.controller.signal, progress: (done, total) => { void reportProgress(run, done, total).catch(() => {}) } })
    await inTransaction(async (t) => {
      const answer = await commit(t)
      const end = typeof answer === 'string' ? { status: 'done' as const, result: answer } : { status: 'done' as const, ...answer }
      if (!(await endRun(run, end, t))) throw new RunLost()
    })
  }
  catch (error) {
    if (error instanceof RunLost) return
    if (entry.controller.signal.aborted) {
      if (entry.cancelled) await endRun(run, { status: 'cancelled' }).catch(() => {})
      return // otherwise another node holds it now
    }
    await endRun(run, { status: 'failed', error: runErrorOf(error) }).catch(e => console.error('[runs] could not record a failure:', e))
  }
  finally {
    held.delete(run.id)
    off()
  }
}

function stop(entry: Held, cancelled: boolean) {
  entry.cancelled ||= cancelled
  entry.controller.abort()
}

async function onQueued(jobs: PgBoss.Job<{ runId: string }>[]): Promise<void> {
  for (const job of jobs) {
    const claim = await claimRun(job.data.runId)
    if (claim && claim !== 'wait') await executeRun(claim)
  }
}

/** Keeps this node's runs alive; stops any it no longer holds (taken over) or whose owner cancelled it. */
async function heartbeat(): Promise<void> {
  if (!held.size) return
  const asked = Date.now()
  const rows = await useDb().query<{ id: string, attempts: number, cancel_requested: boolean }>(
    'UPDATE work_runs SET heartbeat_at = now() WHERE node = :node AND status = \'running\' RETURNING id, attempts, cancel_requested',
    { replacements: { node: WORK.nodeId }, type: QueryTypes.SELECT })
  for (const entry of held.values()) {
    const row = rows.find(r => r.id === entry.run.id && r.attempts === entry.run.attempt)
    if (row?.cancel_requested) stop(entry, true)
    else if (!row && entry.since < asked) stop(entry, false)
  }
}

/**
 * Runs whose node has been quiet for WORK.staleSeconds are queued again for any node (or fail after WORK.maxAttempts,
 * or end cancelled if their owner asked); queued runs that lost their queue entry get a new one; old runs are deleted.
 */
async function sweep(): Promise<void> {
  await inTransaction(async (t) => {
    const rows = await useDb().query<{ id: string, status: string }>(`
      UPDATE work_runs w SET node = NULL, heavy = true,
        status = CASE WHEN cancel_requested THEN 'cancelled' WHEN attempts >= :max THEN 'failed' ELSE 'queued' END,
        finished_at = CASE WHEN cancel_requested OR attempts >= :max THEN now() END,
        error = CASE WHEN NOT cancel_requested AND attempts >= :max THEN jsonb_build_object('status', 500, 'code', 'try-later',
          'message', 'The run stopped ' || attempts || ' times when the server running it stopped; start it again.') END
      WHERE id IN (SELECT id FROM work_runs WHERE status = 'running' AND heartbeat_at < now() - make_interval(secs => :stale) FOR UPDATE SKIP LOCKED)
      RETURNING w.id, w.status`, { replacements: { max: WORK.maxAttempts, stale: WORK.staleSeconds }, type: QueryTypes.SELECT, transaction: t })
    const orphans = await useDb().query<{ id: string }>(`
      SELECT id FROM work_runs w WHERE status = 'queued' AND created_at < now() - interval '1 minute'
        AND NOT EXISTS (SELECT 1 FROM pgboss.job j WHERE j.name = :queue AND j.state < 'completed' AND j.data->>'runId' = w.id::text)
      FOR UPDATE SKIP LOCKED`, { replacements: { queue: WORK_QUEUE }, type: QueryTypes.SELECT, transaction: t })
    for (const r of [...rows.filter(r => r.status === 'queued'), ...orphans]) await enqueueRun(r.id, t)
    for (const r of rows.filter(r => r.status !== 'queued')) await notifyRun(r.id, r.status as 'failed' | 'cancelled', t)
    if (rows.length) console.warn(`[runs] took over ${rows.length} run(s) from a node that stopped`)
  })
  await useDb().query('DELETE FROM work_runs WHERE finished_at < now() - make_interval(mins => :keep)', { replacements: { keep: WORK.keepMinutes } })
}

/** A heavy run was just queued here: this node's idle workers look at the queue now rather than at their next poll. */
export function wakeWorkers(): void {
  void useBoss().then(b => workerIds.forEach(id => b.notifyWorker(id)), () => {})
}

function every(ms: number, task: () => Promise<void>) {
  let busy = false
  const timer = setInterval(() => {
    if (busy) return
    busy = true
    task().catch(e => console.error('[runs]', (e as Error).message)).finally(() => { busy = false })
  }, ms)
  timer.unref()
  timers.push(timer)
}

export function startRunner(): Promise<void> {
  started ??= (async () => {
    await startListener()
    const boss = await useBoss()
    if (WORK.runJobs) {
      for (let i = 0; i < WORK.slots; i++) workerIds.push(await boss.work<{ runId: string }>(WORK_QUEUE, { batchSize: 1, pollingIntervalSeconds: WORK.pollSeconds }, onQueued))
    }
    every(WORK.heartbeatMs, heartbeat)
    every(WORK.sweepMs, sweep)
  })().catch(async (error) => {
    started = undefined
    await stopRunner()
    throw error
  })
  return started
}

/** On shutdown: this node's runs are queued again at once, so another node picks them up without waiting for the sweep. */
export async function stopRunner(): Promise<void> {
  timers.splice(0).forEach(clearInterval)
  const boss = await useBoss().catch(() => null)
  for (const id of workerIds.splice(0)) await boss?.offWork({ id }).catch(() => {})
  if (held.size) {
    await inTransaction(async (t) => {
      const rows = await useDb().query<{ id: string }>('UPDATE work_runs SET status = \'queued\', node = NULL, heavy = true WHERE node = :node AND status = \'running\' RETURNING id',
        { replacements: { node: WORK.nodeId }, type: QueryTypes.SELECT, transaction: t })
      for (const r of rows) await enqueueRun(r.id, t)
    }).catch(e => console.error('[runs] could not hand over runs:', (e as Error).message))
    for (const entry of held.values()) entry.controller.abort()
  }
  await stopBoss()
  await stopListener()
  started = undefined
}
