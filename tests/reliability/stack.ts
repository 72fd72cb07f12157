// The reliability suite's own PostgreSQL cluster and app server (loopback only), so killing PostgreSQL here does not
// disturb the other suites: a cluster under .data/pg-reliability-<pid> on its own port (scripts/db.sh, with the same
// durability settings as every cluster the project starts), a fresh database migrated and seeded with the demo, and
// the built server (.output) on a free port. Used by setup.ts (start, stop) and by the tests (kill and restart).
import { spawn, spawnSync } from 'node:child_process'
import { randomBytes } from 'node:crypto'
import { existsSync, openSync, readFileSync, readdirSync, rmSync, writeFileSync } from 'node:fs'
import net from 'node:net'
import path from 'node:path'
import { fileURLToPath } from 'node:url'

export const ROOT = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../..')
const DATABASE = 'knotwork_reliability'

export interface StackInfo {
  /** the app server, e.g. http://127.0.0.1:41234 */
  baseUrl: string
  /** owner connection to the suite's database, for assertions */
  ownerUrl: string
  /** the app server's process id (its memory is read from /proc) */
  serverPid: number
  /** the cluster's folder and env file, relative to .data/ (scripts/db.sh KW_PG_DIR / KW_PG_ENV) */
  pgDir: string
  pgEnv: string
}

/** Polls `check` until it returns a value other than undefined, null or false; fails with `what` after `timeoutMs`. */
export async function waitFor<T>(what: string, check: () => Promise<T | undefined | null | false> | T | undefined | null | false, timeoutMs = 120_000, everyMs = 100): Promise<T> {
  const until = Date.now() + timeoutMs
  let last: unknown
  for (;;) {
    try {
      const value = await check()
      if (value !== undefined && value !== null && value !== false) return value
    } catch (error) {
      last = error
    }
    if (Date.now() > until) throw new Error(`timed out after ${timeoutMs} ms waiting for ${what}${last ? `: ${(last as Error).message}` : ''}`)
    await new Promise(resolve => setTimeout(resolve, everyMs))
  }
}

function readEnvFile(file: string): Record<string, string> {
  return Object.fromEntries(readFileSync(file, 'utf8').split('\n').filter(l => /^\w+=/.test(l)).map(l => [l.slice(0, l.indexOf('=')), l.slice(l.indexOf('=') + 1)]))
}

/** Runs scripts/db.sh for the suite's cluster (starts it, or restarts it after a crash: PostgreSQL then replays its WAL). */
export function runDbScript(info: Pick<StackInfo, 'pgDir' | 'pgEnv'>, action: 'create' | 'drop' = 'create') {
  const r = spawnSync('bash', ['scripts/db.sh', DATABASE], { cwd: ROOT, env: { ...process.env, KW_PG_DIR: info.pgDir, KW_PG_ENV: info.pgEnv, KW_DB_ACTION: action }, encoding: 'utf8', timeout: 300_000 })
  if (r.status !== 0) throw new Error(`scripts/db.sh failed (${r.status}): ${r.stderr}`)
}

function clusterUrls(info: Pick<StackInfo, 'pgEnv'>) {
  const e = readEnvFile(path.join(ROOT, '.data', info.pgEnv))
  const at = `${e.KW_PG_HOST}:${e.KW_PG_PORT}/${DATABASE}`
  return { owner: `postgres://${e.KW_PG_OWNER}:${e.KW_PG_OWNER_PASSWORD}@${at}`, app: `postgres://${e.KW_PG_APP}:${e.KW_PG_APP_PASSWORD}@${at}`, appRole: e.KW_PG_APP!, port: e.KW_PG_PORT! }
}

function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const server = net.createServer().once('error', reject).listen(0, '127.0.0.1', () => {
      const { port } = server.address() as net.AddressInfo
      server.close(() => resolve(port))
    })
  })
}

function runTsx(script: string, env: Record<string, string>) {
  const r = spawnSync(process.execPath, [path.join(ROOT, 'node_modules/tsx/dist/cli.mjs'), script], { cwd: ROOT, env: { ...process.env, ...env }, encoding: 'utf8', timeout: 300_000 })
  if (r.status !== 0) throw new Error(`${script} failed: ${r.stderr || r.stdout}`)
}

/**
 * What an earlier run left when it was killed before its teardown (scripts/test.sh bounds the step with `timeout`): its
 * app server and its cluster, found by the pid in their names, stopped and removed once that run's process is gone.
 */
function removeLeftovers() {
  const data = path.join(ROOT, '.data')
  for (const name of readdirSync(data)) {
    const run = /^(?:pg-reliability-|reliability-server-)(\d+)(?:\.env|\.log|\.pid)?$/.exec(name)?.[1]
    if (!run || alive(Number(run))) continue
    const pidFile = path.join(data, `reliability-server-${run}.pid`)
    const serverPid = existsSync(pidFile) ? Number(readFileSync(pidFile, 'utf8').trim()) : 0
    if (serverPid && alive(serverPid) && readFileSync(`/proc/${serverPid}/cmdline`, 'utf8').includes('.output/server/index.mjs')) process.kill(serverPid, 'SIGKILL')
    if (name.startsWith('pg-reliability-') && !name.endsWith('.env')) stopCluster(name)
    else rmSync(path.join(data, name), { force: true })
  }
}

function stopCluster(pgDir: string) {
  const pgdata = path.join(ROOT, '.data', pgDir)
  const bin = readdirSync('/usr/lib/postgresql').map(v => `/usr/lib/postgresql/${v}/bin/pg_ctl`).find(existsSync)
  if (bin) spawnSync(process.getuid?.() === 0 ? 'runuser' : bin, [...(process.getuid?.() === 0 ? ['-u', 'postgres', '--', bin] : []), '-D', pgdata, '-m', 'immediate', 'stop'], { timeout: 60_000 })
  rmSync(pgdata, { recursive: true, force: true })
}

export async function startStack(): Promise<StackInfo> {
  if (!existsSync(path.join(ROOT, '.output/server/index.mjs'))) throw new Error('No build: run `npx nuxt build` (scripts/test.sh does) before the reliability suite')
  try { removeLeftovers() } catch (error) { console.warn(`[reliability] leftovers of an earlier run not removed: ${(error as Error).message}`) }
  const pgDir = `pg-reliability-${process.pid}`
  const info = { pgDir, pgEnv: `${pgDir}.env` }
  runDbScript(info)
  const urls = clusterUrls(info)
  runTsx('scripts/migrate.ts', { KW_DATABASE_OWNER_URL: urls.owner, KW_PG_APP: urls.appRole })
  runTsx('scripts/seed.ts', { KW_DATABASE_OWNER_URL: urls.owner })
  const port = await freePort()
  const baseUrl = `http://127.0.0.1:${port}`
  const log = openSync(path.join(ROOT, '.data', `reliability-server-${process.pid}.log`), 'w')
  // secrets of its own; the local fakes (NUXT_STRIPE_*, NUXT_SMTP_*) are passed on when scripts/test.sh started them
  const server = spawn(process.execPath, ['.output/server/index.mjs'], {
    cwd: ROOT,
    stdio: ['ignore', log, log],
    env: {
      ...process.env,
      HOST: '127.0.0.1', PORT: String(port), NITRO_HOST: '127.0.0.1', NITRO_PORT: String(port),
      NUXT_DATABASE_URL: urls.app, NUXT_TRUST_PROXY: '1', NUXT_PUBLIC_BASE_URL: baseUrl,
      NUXT_SESSION_PASSWORD: randomBytes(32).toString('hex'), NUXT_SIGNING_SECRET: randomBytes(32).toString('hex'),
    },
  })
  writeFileSync(path.join(ROOT, '.data', `reliability-server-${process.pid}.pid`), String(server.pid))
  await waitFor('the reliability app server to answer', async () => (await fetch(`${baseUrl}/api/nope`)).status === 404, 120_000, 250)
  return { baseUrl, ownerUrl: urls.owner, serverPid: server.pid!, ...info }
}

export async function stopStack(info: StackInfo) {
  try { process.kill(info.serverPid, 'SIGTERM') } catch { /* already gone */ }
  await waitFor('the app server to stop', () => !alive(info.serverPid), 30_000).catch(() => { try { process.kill(info.serverPid, 'SIGKILL') } catch { /* gone */ } })
  stopCluster(info.pgDir)
  rmSync(path.join(ROOT, '.data', info.pgEnv), { force: true })
  rmSync(path.join(ROOT, '.data', `reliability-server-${process.pid}.pid`), { force: true })
}

/** Whether a process still runs (a zombie, killed but not yet reaped by init, does not). */
export function alive(pid: number): boolean {
  try {
    const stat = readFileSync(`/proc/${pid}/stat`, 'utf8')
    return stat.slice(stat.lastIndexOf(')') + 2, stat.lastIndexOf(')') + 3) !== 'Z'
  } catch {
    return false
  }
}

/** The processes whose parent is `pid` (from /proc), children first found. */
function childrenOf(pid: number): number[] {
  const out: number[] = []
  for (const name of readdirSync('/proc')) {
    if (!/^\d+$/.test(name)) continue
    try {
      const stat = readFileSync(`/proc/${name}/stat`, 'utf8')
      if (Number(stat.slice(stat.lastIndexOf(')') + 2).split(' ')[1]) === pid) out.push(Number(name))
    } catch { /* ended meanwhile */ }
  }
  return out
}

/**
 * SIGKILL to the suite's PostgreSQL: its postmaster first (so it cannot restart its children), then every backend and
 * helper process it started. Nothing gets to flush or shut down cleanly: what survives is what was on disk.
 */
export async function killPostgres(info: Pick<StackInfo, 'pgDir'>): Promise<void> {
  const pidFile = path.join(ROOT, '.data', info.pgDir, 'postmaster.pid')
  const postmaster = Number(readFileSync(pidFile, 'utf8').split('\n')[0])
  const children = childrenOf(postmaster)
  process.kill(postmaster, 'SIGKILL')
  for (const pid of children) { try { process.kill(pid, 'SIGKILL') } catch { /* already gone */ } }
  await waitFor('PostgreSQL processes to end', () => [postmaster, ...children].every(pid => !alive(pid)), 30_000, 20)
}

/** Starts the killed cluster again (crash recovery from the WAL) on the same port. */
export function restartPostgres(info: Pick<StackInfo, 'pgDir' | 'pgEnv'>) {
  const before = clusterUrls(info).port
  runDbScript(info)
  if (clusterUrls(info).port !== before) throw new Error(`PostgreSQL came back on port ${clusterUrls(info).port}, not ${before}`)
}

/** Resident memory of a process in bytes (VmRSS). */
export function rssBytes(pid: number): number {
  const line = readFileSync(`/proc/${pid}/status`, 'utf8').split('\n').find(l => l.startsWith('VmRSS:'))
  return Number(/(\d+)/.exec(line ?? '')?.[1] ?? 0) * 1024
}
