/**
 * npm run bench:load (scripts/bench-load.sh prepares a fresh benchmark database, migrated and seeded with the demo, and
 * the built server). Loopback only, bounded in time; prints figures, asserts nothing (docs/benchmarks.md keeps them).
 *   1. read API on one node: 50 connections (two generator processes x 25) over 1,000 read tokens and the demo's three
 *      signed-off tables, 10 s after a 3 s warm-up: requests/s, p50/p95/p99, non-2xx
 *   2. a signed-in page (GET /orgs/<org>, server-rendered), 10 connections, 10 s
 *   3. another user's GET /api/me (4 connections) alone, then while the largest upload the limits allow is read and
 *      previewed and the heaviest comparison the bench allows runs (8 methods x 50,000 points on ln q; cancelled after
 *      30 s if still running): p50/p95/p99 over each stretch
 *   4. the read API on two nodes (one generator per node, 25 connections each), in the same run: the ratio to (1)
 */
import { spawn } from 'node:child_process'
import { createHash, randomBytes } from 'node:crypto'
import { availableParallelism, loadavg } from 'node:os'
import { Sequelize } from 'sequelize'
import pg from 'pg'
import { METHOD_IDS } from '../shared/engine/contract'
import { IMPORT_COLUMNS_CAP, IMPORT_UPLOAD_BYTES } from '../shared/import-caps'
import { MAX_BENCH_METHODS, MAX_BENCH_POINTS } from '../shared/fills'
import { startNode, stopNode, type AppNode } from '../scripts/app-nodes'
import type { CannonPlan, CannonResult } from './load/cannon'

const ORG = 'larkspur-mutual'
const PASSWORD = 'knotwork-demo-2026'
const TOKENS = 1000
/** KW_LOAD_PARTS=read,two (for instance) runs only those parts: read, page, me, heavy, two */
const PARTS = new Set((process.env.KW_LOAD_PARTS ?? 'read,page,me,heavy,two').split(','))
const db = new Sequelize(process.env.KW_DATABASE_OWNER_URL!, { dialect: 'postgres', dialectModule: pg, logging: false, pool: { max: 2 } })
const sleep = (ms: number) => new Promise(resolve => setTimeout(resolve, ms))

// ---- load generators ----
interface Running { done: Promise<CannonResult>, stop: () => void }
function cannon(plan: CannonPlan): Running {
  const child = spawn(process.execPath, ['--import', 'tsx', 'bench/load/cannon.ts', JSON.stringify(plan)], { stdio: ['ignore', 'pipe', 'inherit'] })
  let out = ''
  child.stdout.on('data', (c: Buffer) => { out += c.toString() })
  const done = new Promise<CannonResult>((resolve, reject) => child.on('exit', code => (code === 0 ? resolve(JSON.parse(out) as CannonResult) : reject(new Error(`generator exited with ${code}`)))))
  return { done, stop: () => child.kill('SIGINT') }
}
interface Figures { rps: number, p50: number, p95: number, p99: number, count: number, non2xx: number, errors: number }
function figures(results: CannonResult[], from = 0, to = Infinity): Figures {
  const all = results.flatMap(r => r.answers).filter(([t]) => t >= from && t <= to).map(([, ms]) => ms).sort((x, y) => x - y)
  const at = (q: number) => all.length ? all[Math.min(all.length - 1, Math.ceil(q * all.length) - 1)]! : NaN
  const seconds = Math.max(...results.map(r => r.seconds))
  return { rps: results.reduce((s, r) => s + r.total, 0) / seconds, p50: at(0.5), p95: at(0.95), p99: at(0.99), count: all.length, non2xx: results.reduce((s, r) => s + r.non2xx, 0), errors: results.reduce((s, r) => s + r.errors, 0) }
}
const ms = (v: number) => `${v.toFixed(1)} ms`
const line = (label: string, f: Figures, extra = '') =>
  console.log(`${label.padEnd(58)} ${f.rps.toFixed(0).padStart(6)} req/s  p50 ${ms(f.p50).padStart(9)}  p95 ${ms(f.p95).padStart(9)}  p99 ${ms(f.p99).padStart(9)}  (${f.count} answers, ${f.non2xx} non-2xx, ${f.errors} errors)${extra}`)

// ---- set-up through the database and the API ----
async function readTokens(): Promise<{ headers: Record<string, string>[], paths: string[] }> {
  const [orgs] = await db.query('SELECT id FROM organisations WHERE slug = :slug', { replacements: { slug: ORG } })
  const orgId = (orgs as { id: string }[])[0]!.id
  const tokens = Array.from({ length: TOKENS }, () => `kwr_${randomBytes(32).toString('base64url')}`)
  await db.query(`INSERT INTO read_tokens (org_id, name, token_hash, hint)
    SELECT :orgId, 'Load benchmark ' || n, h, 'bench' FROM unnest(ARRAY[:hashes]::text[]) WITH ORDINALITY AS x(h, n)`,
  { replacements: { orgId, hashes: tokens.map(t => createHash('sha256').update(t).digest('hex')) } })
  const [tables] = await db.query('SELECT DISTINCT t.id FROM rate_tables t JOIN table_versions v ON v.table_id = t.id WHERE t.org_id = :orgId AND v.status = \'approved\'', { replacements: { orgId } })
  return { headers: tokens.map(t => ({ authorization: `Bearer ${t}` })), paths: (tables as { id: string }[]).map(t => `/api/v1/tables/${t.id}`) }
}

async function signIn(node: AppNode, email: string): Promise<string> {
  const r = await fetch(`${node.url}/api/auth/login`, { method: 'POST', headers: { 'content-type': 'application/json', 'x-forwarded-for': `10.77.${randomBytes(1)[0]}.${randomBytes(1)[0]}` }, body: JSON.stringify({ email, password: PASSWORD }) })
  if (r.status !== 200) throw new Error(`sign-in of ${email} answered ${r.status}`)
  return r.headers.getSetCookie().map(c => c.split(';')[0]).join('; ')
}

/** The largest CSV the upload limits allow: the byte cap filled with short values in every column the cap allows. */
function largestCsv(): { csv: Buffer, rows: number, columns: number } {
  const columns = IMPORT_COLUMNS_CAP
  const header = ['Age', ...Array.from({ length: columns - 1 }, (_, c) => `Rate ${c + 1} q_x`)].join(',') + '\n'
  const row = (r: number) => [`${(r / 1000).toFixed(3)}`, ...Array.from({ length: columns - 1 }, (_, c) => (0.001 + ((r * 7 + c * 13) % 997) / 1e5).toFixed(5))].join(',') + '\n'
  const budget = IMPORT_UPLOAD_BYTES - 64 * 1024 - header.length
  const rows = Math.floor(budget / Buffer.byteLength(row(99_999)))
  return { csv: Buffer.from(header + Array.from({ length: rows }, (_, r) => row(r)).join('')), rows, columns }
}

async function main() {
  const started = new Date()
  console.log(`Knotwork load benchmark, ${started.toISOString()}`)
  console.log(`Node ${process.version}, ${availableParallelism()} cores, load average at start ${loadavg().map(l => l.toFixed(2)).join(' ')}`)
  const read = await readTokens()
  const a = await startNode('bench-A')
  console.log(`Node A ${a.url} (worker threads ${process.env.KW_WORKER_THREADS ?? 'one per CPU'}); ${TOKENS} read tokens over ${read.paths.length} signed-off tables`)
  const readPlan = (url: string, connections: number, seconds: number): CannonPlan => ({ url, connections, seconds, paths: read.paths, headers: read.headers })

  // 1. read API, one node (also the baseline of part 4)
  await Promise.all([cannon(readPlan(a.url, 25, 3)).done, cannon(readPlan(a.url, 25, 3)).done])
  const oneNode = figures(await Promise.all([cannon(readPlan(a.url, 25, 10)).done, cannon(readPlan(a.url, 25, 10)).done]))
  line('1. read API, one node, 50 connections', oneNode)

  if (PARTS.has('page')) await signedInPage(a)
  if (PARTS.has('me')) await meQuiet(a)
  if (PARTS.has('heavy')) await heavyWork(a)
  if (PARTS.has('two')) {
    // 4. read API, two nodes, in the same run
    const b = await startNode('bench-B')
    await Promise.all([cannon(readPlan(a.url, 25, 3)).done, cannon(readPlan(b.url, 25, 3)).done])
    const twoNodes = figures(await Promise.all([cannon(readPlan(a.url, 25, 10)).done, cannon(readPlan(b.url, 25, 10)).done]))
    line('4. read API, two nodes, 50 connections (25 each)', twoNodes)
    console.log(`    two nodes / one node: ${(twoNodes.rps / oneNode.rps).toFixed(2)} x`)
    await stopNode(b)
  }
  console.log(`Load average at end ${loadavg().map(l => l.toFixed(2)).join(' ')}`)
  console.log('Targets: read API p95 <= 100 ms at 50 connections (1); another user\'s p99 <= 250 ms during heavy work (3b-3e); two nodes >= 1.3 x one node (4).')
  await stopNode(a)
  await db.close()
}

async function signedInPage(a: AppNode) {
  // 2. a signed-in page
  const analyst = await signIn(a, 'priya.raman@larkspur.example')
  const pagePlan = { url: a.url, connections: 10, seconds: 10, paths: [`/orgs/${ORG}`], headers: [{ cookie: analyst, accept: 'text/html' }] }
  await cannon({ ...pagePlan, seconds: 2 }).done
  line(`2. signed-in page GET /orgs/${ORG}, 10 connections`, figures([await cannon(pagePlan).done]))
}

// 3. another user's GET /api/me, alone and during heavy work
async function mePlan(a: AppNode, seconds: number): Promise<CannonPlan> {
  const auditor = await signIn(a, 'greta.lind@larkspur.example')
  return { url: a.url, connections: 4, seconds, paths: ['/api/me'], headers: [{ cookie: auditor }] }
}

async function meQuiet(a: AppNode) {
  line('3a. another user\'s GET /api/me, quiet, 4 connections', figures([await cannon(await mePlan(a, 10)).done]))
}

async function heavyWork(a: AppNode) {
  const actuary = await signIn(a, 'tomas.varga@larkspur.example')
  const [bench] = await db.query(`SELECT t.id, max(v.number) AS number FROM rate_tables t JOIN organisations o ON o.id = t.org_id JOIN table_versions v ON v.table_id = t.id
    WHERE o.slug = :slug AND t.name = 'Pensioner mortality, male' GROUP BY t.id`, { replacements: { slug: ORG } })
  const version = (bench as { id: string, number: number }[])[0]!
  const { csv, rows, columns } = largestCsv()
  const me = cannon(await mePlan(a, 180))
  await sleep(1500)
  const marks: Record<string, number> = {}
  marks.uploadStart = Date.now()
  const form = new FormData()
  form.append('file', new Blob([new Uint8Array(csv)]), 'largest.csv')
  const upload = await fetch(`${a.url}/api/orgs/${ORG}/imports`, { method: 'POST', headers: { cookie: actuary }, body: form })
  marks.uploadEnd = Date.now()
  const imported = await upload.json() as { id: string, sheets: { name: string, headerGuess: number }[] }
  if (upload.status !== 201) throw new Error(`upload answered ${upload.status}: ${JSON.stringify(imported).slice(0, 300)}`)
  // the heaviest comparison: as many methods and points as the bench takes, on ln q (log-linear works on ln y itself)
  const step = (55 / (MAX_BENCH_POINTS - 1)).toFixed(7)
  const to = (55 + Number(step) * (MAX_BENCH_POINTS - 1)).toFixed(7)
  const methods = METHOD_IDS.slice(0, MAX_BENCH_METHODS).map(method => ({ method, ...(method === 'log-linear' ? { transform: 'none' as const } : {}) }))
  const runId = `load-bench-${randomBytes(4).toString('hex')}`
  marks.compareStart = Date.now()
  const compare = await fetch(`${a.url}/api/orgs/${ORG}/tables/${version.id}/versions/${version.number}/compare`, { method: 'POST', headers: { 'cookie': actuary, 'content-type': 'application/json', 'prefer': 'respond-async' },
    body: JSON.stringify({ grid: { from: '55', to, step }, transform: 'log', methods, runId }) })
  if (compare.status !== 202) throw new Error(`compare answered ${compare.status}: ${(await compare.text()).slice(0, 300)}`)
  const mapping = { sheet: imported.sheets[0]!.name, headerRow: 0, axisColumn: 0, axis: 'age', axisUnit: 'years', edits: {}, description: '',
    columns: Array.from({ length: columns - 1 }, (_, c) => ({ index: c + 1, name: `Load bench ${runId} ${c + 1}`, kind: 'mortality', valueUnit: 'per-unit' })) }
  marks.previewStart = Date.now()
  const preview = await fetch(`${a.url}/api/orgs/${ORG}/imports/${imported.id}/preview`, { method: 'POST', headers: { 'cookie': actuary, 'content-type': 'application/json' }, body: JSON.stringify(mapping) })
  const previewed = await preview.json() as { tables?: unknown[], errors?: number }
  marks.previewEnd = Date.now()
  let run = { status: 'running', done: 0, total: methods.length }
  while (Date.now() - marks.compareStart < 30_000 && ['queued', 'running'].includes(run.status)) {
    await sleep(500)
    run = await (await fetch(`${a.url}/api/orgs/${ORG}/runs/${runId}`, { headers: { cookie: actuary } })).json() as typeof run
  }
  marks.compareEnd = Date.now()
  if (['queued', 'running'].includes(run.status)) await fetch(`${a.url}/api/orgs/${ORG}/runs/${runId}`, { method: 'DELETE', headers: { cookie: actuary } })
  await sleep(1000)
  me.stop()
  const during = [await me.done]
  const secs = (from: number, till: number) => `${((till - from) / 1000).toFixed(1)} s`
  console.log(`    largest upload: ${(csv.length / 1048576).toFixed(1)} MiB CSV, ${rows.toLocaleString('en-GB')} rows x ${columns} columns (${(rows * columns).toLocaleString('en-GB')} cells), read in ${secs(marks.uploadStart, marks.uploadEnd)}`)
  console.log(`    preview of ${columns - 1} value columns: ${preview.status} in ${secs(marks.previewStart, marks.previewEnd)} (${previewed.tables?.length ?? 0} tables, ${previewed.errors ?? '?'} errors)`)
  console.log(`    heaviest comparison: ${methods.length} methods x ${MAX_BENCH_POINTS.toLocaleString('en-GB')} points on ln q: ${run.status}, ${run.done} of ${run.total} methods after ${secs(marks.compareStart, marks.compareEnd)}${['queued', 'running'].includes(run.status) ? ' (then cancelled)' : ''}`)
  line('3b. GET /api/me while the upload is read', figures(during, marks.uploadStart, marks.uploadEnd))
  line('3c. GET /api/me during the preview and the comparison', figures(during, marks.previewStart, marks.previewEnd))
  line('3d. GET /api/me during the comparison (whole stretch)', figures(during, marks.compareStart, marks.compareEnd))
  line('3e. GET /api/me over all the heavy work', figures(during, marks.uploadStart, marks.compareEnd))
}

main().catch(async (error) => {
  console.error(error)
  process.exit(1)
})
