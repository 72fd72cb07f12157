import { randomBytes } from 'node:crypto'
import pg from 'pg'
import { describe, expect, it } from 'vitest'
import type { Client, Reply } from '../api/helpers'
import { DEMO, crashAndRecover, person, stack, withOwner } from './helpers'
import { waitFor } from './stack'

// SIGKILL of PostgreSQL in the middle of an import's create step and of a sign-off leaves nothing half-done: either all
// of the change is there or none of it, and the same request succeeds once PostgreSQL is back.
// To kill at a known point, the test holds the organisation's audit-chain lock (the advisory lock every audited change
// takes, server/lib/audit-writer.ts) from its own connection: the request's transaction writes its first rows, then
// waits on that lock; the test sees it waiting (pg_stat_activity) and kills PostgreSQL there.

/** Holds the organisation's audit-chain lock until PostgreSQL dies. */
async function holdAuditLock(orgSlug: string): Promise<pg.Client> {
  const holder = new pg.Client({ connectionString: stack().ownerUrl })
  holder.on('error', () => {}) // its connection dies with PostgreSQL
  await holder.connect()
  await holder.query(`SELECT pg_advisory_lock(hashtext(id::text)) FROM organisations WHERE slug = $1`, [orgSlug])
  return holder
}

/**
 * Waits until the request's transaction has written rows of `table` and waits for the audit-chain lock (pg_locks: an
 * advisory lock not granted, held by a backend that holds a row-write lock on `table`). Fails at once if the request
 * answered first.
 */
async function waitUntilBlockedAfterWriting(table: string, request: { settled: Reply<unknown> | null }) {
  await waitFor(`the app's transaction to write ${table} and wait for the audit lock`, () => {
    if (request.settled) throw new Error(`the request answered ${request.settled.status} before it could be stopped: ${JSON.stringify(request.settled.body).slice(0, 300)}`)
    return withOwner(async (db) => {
      const { rows } = await db.query(`
        SELECT l.pid FROM pg_locks l WHERE l.locktype = 'advisory' AND NOT l.granted
          AND EXISTS (SELECT 1 FROM pg_locks w WHERE w.pid = l.pid AND w.locktype = 'relation' AND w.relation = $1::regclass AND w.mode = 'RowExclusiveLock')`, [table])
      return rows.length === 1
    })
  }, 120_000, 50)
}

/** A request left running; `settled` is its answer once it has one. */
function inFlight<T>(request: Promise<Reply<T>>) {
  const state: { settled: Reply<T> | null; answer: Promise<Reply<T>> } = { settled: null, answer: Promise.resolve(null as never) }
  state.answer = request.catch(() => ({ status: 0, body: null } as Reply<T>)).then((r) => { state.settled = r; return r })
  return state
}

/** Runs `work` while holding the organisation's audit-chain lock; the lock goes with PostgreSQL, or is let go after. */
async function withAuditLockHeld(orgSlug: string, work: () => Promise<void>) {
  const holder = await holdAuditLock(orgSlug)
  try {
    await work()
  } finally {
    await holder.end().catch(() => {})
  }
}


describe('SIGKILL during an import create step', () => {
  it('creates all of the tables or none of them, and the upload can be created afterwards', async () => {
    const analyst = await person(DEMO.analyst)
    const run = randomBytes(3).toString('hex')
    const csv = `age,male ${run},female ${run},joint ${run}\n${Array.from({ length: 3000 }, (_, i) => `${i / 10},0.0${1000 + i},0.0${2000 + i},0.0${3000 + i}`).join('\n')}\n`
    const form = new FormData()
    form.append('file', new Blob([csv]), `crash-${run}.csv`)
    const up = await analyst.post<{ id: string; sheets: { name: string }[] }>('/api/orgs/larkspur-mutual/imports', form)
    expect(up.status).toBe(201)
    const names = ['male', 'female', 'joint'].map(n => `Crash test ${n} ${run}`)
    const mapping = { sheet: up.body.sheets[0]!.name, headerRow: 0, axisColumn: 0, axis: 'age', axisUnit: 'years', edits: {}, description: '',
      columns: names.map((name, i) => ({ index: i + 1, name, kind: 'mortality', valueUnit: 'per-unit' })) }
    const commitPath = `/api/orgs/larkspur-mutual/imports/${up.body.id}/commit`

    await withAuditLockHeld('larkspur-mutual', async () => {
      const commit = inFlight(analyst.post(commitPath, { mapping, acceptWarnings: true }))
      await waitUntilBlockedAfterWriting('version_points', commit)
      await crashAndRecover(analyst)
      expect((await commit.answer).status).not.toBe(201) // never acknowledged
    })

    const count = (sql: string, params: unknown[]) => withOwner(async db => Number((await db.query<{ n: string }>(sql, params)).rows[0]!.n))
    expect(await count('SELECT count(*) AS n FROM rate_tables WHERE name = ANY($1)', [names])).toBe(0)
    expect(await count(`SELECT count(*) AS n FROM table_versions v WHERE NOT EXISTS (SELECT 1 FROM rate_tables t WHERE t.id = v.table_id)`, [])).toBe(0)
    expect((await analyst.get(`/api/orgs/larkspur-mutual/imports/${up.body.id}`)).status).toBe(200) // the upload is still there

    const again = await analyst.post<{ tables: { id: string }[] }>(commitPath, { mapping, acceptWarnings: true })
    expect(again.status).toBe(201)
    expect(await count(`SELECT count(*) AS n FROM version_points p JOIN table_versions v ON v.id = p.version_id JOIN rate_tables t ON t.id = v.table_id
      WHERE t.name = ANY($1)`, [names])).toBe(3 * 3000)
  })
})

async function submittedDraft(analyst: Client) {
  const { rows } = await withOwner(db => db.query<{ id: string; number: number }>(
    `SELECT t.id, v.number FROM rate_tables t JOIN table_versions v ON v.table_id = t.id
     WHERE t.name = 'Pensioner mortality, male' AND v.status = 'draft' ORDER BY v.number DESC LIMIT 1`))
  const version = `/api/orgs/larkspur-mutual/tables/${rows[0]!.id}/versions/${rows[0]!.number}`
  const draft = await analyst.get<{ lockVersion: number }>(version)
  const fill = await analyst.post(`${version}/fill`, { grid: { from: '55', to: '110', step: '1' }, choice: { method: 'linear' },
    rationale: 'Straight lines are enough for this crash test of the sign-off.', lockVersion: draft.body.lockVersion })
  expect(fill.status, JSON.stringify(fill.body)).toBe(200)
  expect((await analyst.post(`${version}/submit`, {})).status).toBe(200)
  return { version, tableId: rows[0]!.id, number: rows[0]!.number }
}

describe('SIGKILL during a sign-off', () => {
  it('leaves the version awaiting its second check and the previous one signed off, or the whole sign-off done', async () => {
    const analyst = await person(DEMO.analyst)
    const actuary = await person(DEMO.actuary)
    const { version, tableId, number } = await submittedDraft(analyst)
    const states = () => withOwner(async db => (await db.query<{ number: number; status: string }>(
      'SELECT number, status FROM table_versions WHERE table_id = $1 ORDER BY number', [tableId])).rows)
    const before = await states()
    expect(before.find(v => v.number === number)!.status).toBe('in-review')
    expect(before.filter(v => v.status === 'approved')).toHaveLength(1)
    // a sign-off signs the trail's head with the organisation's key; on a fresh database the first one would make (and
    // audit) that key before its own transaction, and wait for the held lock there instead of after writing the version
    expect((await (await person(DEMO.admin)).post('/api/orgs/larkspur-mutual/signing-keys/rotate', {})).status).toBe(200)

    await withAuditLockHeld('larkspur-mutual', async () => {
      const approve = inFlight(actuary.post(`${version}/approve`, { comment: 'Checked.' }))
      await waitUntilBlockedAfterWriting('table_versions', approve)
      await crashAndRecover(actuary)
      expect((await approve.answer).status).not.toBe(200)
    })

    expect(await states()).toEqual(before) // nothing half-done: no version signed off, none withdrawn
    const approvals = await withOwner(async db => (await db.query(
      `SELECT 1 FROM version_comments c JOIN table_versions v ON v.id = c.version_id WHERE v.table_id = $1 AND v.number = $2 AND c.kind = 'approve'`, [tableId, number])).rowCount)
    expect(approvals).toBe(0)

    expect((await actuary.post(`${version}/approve`, { comment: 'Checked.' })).status).toBe(200)
    const after = await states()
    expect(after.find(v => v.number === number)!.status).toBe('approved')
    expect(after.filter(v => v.status === 'approved')).toHaveLength(1)
    expect(after.filter(v => v.status === 'retired')).toHaveLength(before.filter(v => v.status === 'retired').length + 1)
  })
})
