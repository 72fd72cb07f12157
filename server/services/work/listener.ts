import { EventEmitter } from 'node:events'
import pg from 'pg'
import type { Transaction } from 'sequelize'

// One LISTEN connection per node: a run that finishes or is cancelled on any node wakes whoever waits for it here at
// once. Only a wake-up: waiters also look at the row now and then, so a lost notification costs a second, nothing more.
const CHANNEL = 'knotwork_runs'
export type RunEvent = 'done' | 'failed' | 'cancelled' | 'cancel'

const events = new EventEmitter()
events.setMaxListeners(0)
let client: pg.Client | undefined
let stopped = false

export async function startListener(): Promise<void> {
  stopped = false
  const c = new pg.Client({ connectionString: useRuntimeConfig().databaseUrl, application_name: 'knotwork-listen' })
  c.on('notification', (n) => {
    const [id, what] = (n.payload ?? '').split(':')
    if (id && what) events.emit(id, what as RunEvent)
  })
  const again = () => {
    if (client !== c || stopped) return
    client = undefined
    c.removeAllListeners('error')
    c.on('error', () => {})
    setTimeout(() => { void startListener().catch(() => {}) }, 1000).unref()
  }
  c.on('error', again)
  c.on('end', again)
  client = c
  try {
    await c.connect()
    await c.query(`LISTEN ${CHANNEL}`)
  }
  catch (error) {
    again()
    throw error
  }
}

export async function stopListener(): Promise<void> {
  stopped = true
  const c = client
  client = undefined
  await c?.end().catch(() => {})
}

export function onRunEvent(runId: string, listener: (what: RunEvent) => void): () => void {
  events.on(runId, listener)
  return () => { events.off(runId, listener) }
}

/** Tells every node (delivered when `t` commits, or at once without one). */
export async function notifyRun(runId: string, what: RunEvent, t?: Transaction): Promise<void> {
  await useDb().query('SELECT pg_notify(:channel, :payload)', { replacements: { channel: CHANNEL, payload: `${runId}:${what}` }, transaction: t })
}
