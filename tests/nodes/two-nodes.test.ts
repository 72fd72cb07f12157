// Two app nodes on one PostgreSQL, as behind a load balancer (README "Several app nodes"): nothing a request needs lives
// in one process. Each check alternates between the nodes, so it fails if sessions, run progress and results, the read
// API's rate limit or the sign-in throttle were kept per process; one node is killed (SIGKILL) mid-run.
import { randomBytes } from 'node:crypto'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { CompareResponseDto } from '#shared/types/fills'
import type { RunDto } from '#shared/types/runs'
import { Client, DEMO, FENWICK, LARKSPUR, closeOwnerDb, freshOrg, ownerDb, signedIn } from '../api/helpers'
import { QUICK_TAKEOVER, startNode, stopNode, type AppNode } from '~~/scripts/app-nodes'

let a: AppNode
let b: AppNode
beforeAll(async () => {
  // two worker threads: each node takes one heavy run at a time; one heavy run per organisation over both nodes
  const env = { ...QUICK_TAKEOVER, KW_WORKER_THREADS: '2', KW_ORG_RUN_LIMIT: '1' }
  ;[a, b] = await Promise.all([startNode('A', env), startNode('B', env)])
})
afterAll(async () => {
  await Promise.all([a, b].filter(Boolean).map(n => stopNode(n)))
  await closeOwnerDb()
})

const sleep = (ms: number) => new Promise(resolve => setTimeout(resolve, ms))
const on = (client: Client, node: AppNode) => { client.base = node.url; return client }

async function benchVersion(slug = LARKSPUR, name = 'Pensioner mortality, male'): Promise<string> {
  const [rows] = await ownerDb().query(`SELECT t.id, max(v.number) AS number FROM rate_tables t JOIN organisations o ON o.id = t.org_id JOIN table_versions v ON v.table_id = t.id
    WHERE o.slug = :slug AND t.name = :name GROUP BY t.id`, { replacements: { slug, name } })
  const { id, number } = (rows as { id: string, number: number }[])[0]!
  return `/api/orgs/${slug}/tables/${id}/versions/${number}`
}

/** Follows a run on one node until it ends; every state seen on the way. */
async function follow(client: Client, runId: string, timeoutMs = 240_000): Promise<RunDto[]> {
  const seen: RunDto[] = []
  for (const end = Date.now() + timeoutMs; Date.now() < end;) {
    const r = await client.get<RunDto>(`/api/orgs/${LARKSPUR}/runs/${runId}`)
    expect(r.status).toBe(200)
    seen.push(r.body)
    if (['done', 'failed', 'cancelled'].includes(r.body.status)) return seen
    await sleep(200)
  }
  throw new Error(`run ${runId} did not end in time: ${JSON.stringify(seen.at(-1))}`)
}

describe('two app nodes on one PostgreSQL', () => {
  it('a person signs in on one node and carries on on the other; signing out on one ends the session on both', async () => {
    const person = await new Client(undefined, a.url).login(DEMO.actuary)
    on(person, b)
    const me = await person.get<{ user: { email: string } }>('/api/me')
    expect(me.status).toBe(200)
    expect(me.body.user.email).toBe(DEMO.actuary)
    expect((await person.get(`/api/orgs/${LARKSPUR}/tables`)).status).toBe(200)
    const cookie = person.cookie
    expect((await person.post('/api/auth/logout')).status).toBe(200)
    const stale = new Client(undefined, a.url)
    stale.cookie = cookie
    expect((await stale.get('/api/me')).status).toBe(401)
  })

  it('a comparison started on one node is followed to its end on the other, progress and result', async () => {
    const actuary = await signedIn(DEMO.actuary, undefined, a.url)
    const url = `${await benchVersion()}/compare`
    const body = { grid: { from: '55', to: '110', step: '0.01' }, methods: [{ method: 'linear' }, { method: 'quadratic' }, { method: 'cubic-natural' }, { method: 'pchip' }] }
    const runId = `two-nodes-${randomBytes(6).toString('hex')}`
    const started = await actuary.post<RunDto>(url, { ...body, runId }, { prefer: 'respond-async' })
    expect(started.status).toBe(202)
    expect(started.headers.get('location')).toBe(`/api/orgs/${LARKSPUR}/runs/${runId}`)
    on(actuary, b)
    const seen = await follow(actuary, runId)
    expect(seen.at(-1)).toMatchObject({ status: 'done', done: 4, total: 4 })
    expect(seen.every(s => s.total === 4 && s.done >= 0 && s.done <= 4)).toBe(true)
    const progress = await actuary.get<{ done: number, total: number, status: string }>(`/api/orgs/${LARKSPUR}/compare-progress/${runId}`)
    expect(progress.body).toEqual({ done: 4, total: 4, status: 'done' })
    const result = await actuary.get<CompareResponseDto>(`/api/orgs/${LARKSPUR}/runs/${runId}/result`)
    expect(result.status).toBe(200)
    // the same comparison run directly on node B gives the same numbers
    const direct = await actuary.post<CompareResponseDto>(url, body)
    expect(direct.status).toBe(200)
    expect(result.body.result).toEqual(direct.body.result)
    // nobody else follows it, on either node
    const other = await signedIn(DEMO.analyst, undefined, a.url)
    expect((await other.get(`/api/orgs/${LARKSPUR}/runs/${runId}`)).status).toBe(404)
  })

  it('one organisation\'s heavy runs wait for each other, not for another organisation\'s', async () => {
    const tomas = await signedIn(DEMO.actuary, undefined, a.url)
    const felix = await signedIn(DEMO.both, undefined, b.url)
    // heavy (through the queue): 5,501 points x 3 methods on ln q
    const heavy = { grid: { from: '55', to: '110', step: '0.01' }, transform: 'log', methods: [{ method: 'cubic-natural' }, { method: 'pchip' }, { method: 'akima' }] }
    const key = (name: string) => `${name}-${randomBytes(6).toString('hex')}`
    const runs = { l1: key('larkspur-1'), l2: key('larkspur-2'), f1: key('fenwick-1') }
    for (const runId of [runs.l1, runs.l2]) expect((await tomas.post(`${await benchVersion()}/compare`, { ...heavy, runId }, { prefer: 'respond-async' })).status).toBe(202)
    expect((await felix.post(`${await benchVersion(FENWICK, 'Client scheme mortality, unisex')}/compare`, { ...heavy, runId: runs.f1 }, { prefer: 'respond-async' })).status).toBe(202)
    type Seen = { run_key: string, status: string, started_at: Date | null }
    let rows: Seen[] = []
    let bothLarkspur = false
    for (const end = Date.now() + 240_000; Date.now() < end;) {
      ;[rows] = await ownerDb().query('SELECT run_key, status, started_at FROM work_runs WHERE run_key IN (:keys)', { replacements: { keys: Object.values(runs) } }) as [Seen[], unknown]
      const status = (k: string) => rows.find(r => r.run_key === k)?.status
      bothLarkspur ||= status(runs.l1) === 'running' && status(runs.l2) === 'running'
      if (rows.every(r => r.status === 'done')) break
      await sleep(100)
    }
    expect(rows.map(r => r.status)).toEqual(['done', 'done', 'done'])
    expect(bothLarkspur).toBe(false)
    // Larkspur's second run was queued before Fenwick & Rowe's, yet Fenwick & Rowe's started first: a free node skipped it
    const started = (k: string) => new Date(rows.find(r => r.run_key === k)!.started_at!).getTime()
    expect(started(runs.f1)).toBeLessThan(Math.max(started(runs.l1), started(runs.l2)))
  })

  it('the read API\'s rate limit is counted once for both nodes', async () => {
    const { client: admin, slug } = await freshOrg(undefined, a.url)
    const created = await on(admin, b).post<{ token: string }>(`/api/orgs/${slug}/read-tokens`, { name: 'Two nodes' })
    expect(created.status).toBe(201)
    // 400 requests inside one clock minute, 200 on each node: one count for both lets 300 through, a count per node all 400
    const [clock] = await ownerDb().query('SELECT extract(second FROM now())::int AS s')
    if ((clock as { s: number }[])[0]!.s > 40) await sleep((61 - (clock as { s: number }[])[0]!.s) * 1000)
    const statuses: { node: string, status: number }[] = []
    for (let i = 0; i < 400; i += 20) {
      const batch = await Promise.all(Array.from({ length: 20 }, (_, k) => {
        const node = (i + k) % 2 ? b : a
        return fetch(`${node.url}/api/v1/tables`, { headers: { authorization: `Bearer ${created.body.token}` } }).then(r => ({ node: node.name, status: r.status }))
      }))
      statuses.push(...batch)
    }
    expect(statuses.filter(s => s.status === 200)).toHaveLength(300)
    expect(statuses.filter(s => s.status === 429)).toHaveLength(100)
    expect(new Set(statuses.filter(s => s.status === 429).map(s => s.node))).toEqual(new Set(['A', 'B']))
  })

  it('the sign-in throttle is counted once for both nodes', async () => {
    const { email, password } = await freshOrg(undefined, a.url)
    const guesser = new Client(undefined, a.url)
    for (let i = 0; i < 10; i++) {
      const r = await on(guesser, i % 2 ? b : a).post('/api/auth/login', { email, password: `wrong guess ${i}` })
      expect(r.status).toBe(401)
    }
    // five failures on each node: a count per node would still let both try
    expect((await on(guesser, a).post('/api/auth/login', { email, password })).status).toBe(429)
    expect((await on(guesser, b).post('/api/auth/login', { email, password })).status).toBe(429)
  })

  it('a run whose node is killed is finished by the other node, once', async () => {
    const actuary = await signedIn(DEMO.actuary, undefined, a.url)
    const url = `${await benchVersion()}/compare`
    const runId = `takeover-${randomBytes(6).toString('hex')}`
    // heavy (a fine grid on ln q, 27,501 points by six methods): it goes through the queue and takes several seconds in
    // one worker thread even on an idle machine (11,001 points by three methods ended in about a second there, before the
    // kill came)
    const methods = ['cubic-natural', 'pchip', 'akima', 'cubic-not-a-knot', 'quadratic', 'linear'].map(method => ({ method }))
    const started = await actuary.post<RunDto>(url, { grid: { from: '55', to: '110', step: '0.002' }, transform: 'log', methods, runId }, { prefer: 'respond-async' })
    expect(started.status).toBe(202)
    let holder: { node: string, attempts: number } | undefined
    for (let i = 0; i < 600 && !holder; i++) {
      const [rows] = await ownerDb().query('SELECT node, attempts, status FROM work_runs WHERE run_key = :runId', { replacements: { runId } })
      const row = (rows as { node: string | null, attempts: number, status: string }[])[0]
      if (row?.status === 'running' && row.node) holder = { node: row.node, attempts: row.attempts }
      else await sleep(100)
    }
    expect(holder).toBeDefined()
    const pidOf = (node: string) => Number(node.split(':').at(-2))
    const [doomed, survivor] = pidOf(holder!.node) === a.process.pid ? [a, b] : [b, a]
    expect(pidOf(holder!.node)).toBe(doomed.process.pid)
    await sleep(300)
    await stopNode(doomed, 'SIGKILL')
    on(actuary, survivor)
    const seen = await follow(actuary, runId)
    expect(seen.at(-1)).toMatchObject({ status: 'done', done: 6, total: 6, attempts: holder!.attempts + 1 })
    const [rows] = await ownerDb().query('SELECT node, attempts, length(result) > 0 AS has_result FROM work_runs WHERE run_key = :runId', { replacements: { runId } })
    const row = (rows as { node: string, attempts: number, has_result: boolean }[])[0]!
    expect(pidOf(row.node)).toBe(survivor.process.pid)
    expect(row.has_result).toBe(true)
    const result = await actuary.get<CompareResponseDto>(`/api/orgs/${LARKSPUR}/runs/${runId}/result`)
    expect(result.body.result.entries.map(e => e.ok)).toEqual(methods.map(() => true))
    expect(result.body.pointCount).toBe(12)
  })
})
