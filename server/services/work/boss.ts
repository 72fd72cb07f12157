import PgBoss from 'pg-boss'
import type { Transaction } from 'sequelize'
import { BOSS_SCHEMA, WORK_QUEUE } from '../../lib/work/queue'
import { WORK } from './config'

// This node's pg-boss client: delivers queued runs to exactly one node at a time (SKIP LOCKED), retries a delivery
// whose handler failed, and keeps the queue tables trimmed. Migrations are the owner's (scripts/migrate.ts).
let boss: Promise<PgBoss> | undefined

export function useBoss(): Promise<PgBoss> {
  boss ??= (async () => {
    const b = new PgBoss({ connectionString: useRuntimeConfig().databaseUrl, schema: BOSS_SCHEMA, migrate: false, schedule: false, supervise: true, max: 3, application_name: `knotwork-queue ${WORK.nodeId}` })
    b.on('error', error => console.error('[runs] queue:', (error as Error).message))
    await b.start()
    return b
  })().catch((error) => {
    boss = undefined
    throw error
  })
  return boss
}

/** pg-boss's statements on the transaction's own connection, so a run and its queue entry commit together. */
function onTransaction(t: Transaction): PgBoss.Db {
  const client = (t as unknown as { connection: { query: (text: string, values?: unknown[]) => Promise<{ rows: unknown[] }> } }).connection
  return { executeSql: (text, values) => client.query(text, values) as never }
}

/** Puts a run on the queue (optionally not before `afterSeconds`), inside the caller's transaction. */
export async function enqueueRun(runId: string, t: Transaction, afterSeconds = 0): Promise<void> {
  const b = await useBoss()
  await b.send(WORK_QUEUE, { runId }, {
    db: onTransaction(t),
    retryLimit: 2,
    retryDelay: 2,
    // a run can take long; this node's heartbeat, not pg-boss's expiry, decides when it is taken over
    expireInMinutes: 120,
    ...(afterSeconds > 0 ? { startAfter: afterSeconds } : {}),
  })
}

export async function stopBoss(): Promise<void> {
  const b = boss
  boss = undefined
  await (await b?.catch(() => undefined))?.stop({ graceful: false, wait: true })
}
