import { readdirSync, statSync } from 'node:fs'
import path from 'node:path'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { Client, DEMO, FENWICK, LARKSPUR, closeOwnerDb, signedIn } from './helpers'
import { ROUTES } from './route-matrix/index'
import type { Caller, MatrixContext } from './route-matrix/types'
import { lookupIds } from './route-matrix/ids'
import { API_ERROR_CODES } from '#shared/api-errors'

/** Every route file under server/api as "METHOD /api/path". */
function routeFiles(dir = 'server/api', prefix = '/api'): string[] {
  const out: string[] = []
  for (const name of readdirSync(dir)) {
    const full = path.join(dir, name)
    if (statSync(full).isDirectory()) { out.push(...routeFiles(full, `${prefix}/${name}`)); continue }
    const m = /^(.*?)\.(get|post|put|patch|delete)\.ts$/.exec(name)
    if (!m) continue
    out.push(`${m[2]!.toUpperCase()} ${m[1] === 'index' ? prefix : `${prefix}/${m[1]}`}`)
  }
  return out.sort()
}

const files = routeFiles()
const callers: Caller[] = ['anonymous', 'admin', 'actuary', 'analyst', 'auditor', 'otherOrg']
const clients = {} as Record<Caller, Client>
let ctx: MatrixContext

beforeAll(async () => {
  clients.anonymous = new Client()
  clients.admin = await signedIn(DEMO.admin)
  clients.actuary = await signedIn(DEMO.actuary)
  clients.analyst = await signedIn(DEMO.analyst)
  clients.auditor = await signedIn(DEMO.auditor)
  clients.otherOrg = await signedIn(DEMO.otherAdmin)
  ctx = { org: LARKSPUR, ids: await lookupIds(LARKSPUR) }
})
afterAll(closeOwnerDb)

describe('route matrix', () => {
  it('has an entry for every route file, and no entry without a file', () => {
    expect(files.filter(f => !ROUTES[f])).toEqual([])
    expect(Object.keys(ROUTES).filter(k => !files.includes(k))).toEqual([])
  })

  for (const key of files) {
    it(key, async () => {
      const entry = ROUTES[key]
      expect(entry, `no route-matrix entry for ${key}`).toBeDefined()
      const [method, pattern] = key.split(' ') as [string, string]
      const concrete = entry!.path ? await entry!.path(ctx) : pattern.replace('[org]', LARKSPUR)
      const problems: string[] = []
      for (const caller of callers) {
        const wanted = entry!.expect[caller]
        // auth routes change the caller's session: use a throwaway client for them
        const client = key.startsWith('POST /api/auth/') && caller !== 'anonymous' ? await signedIn(caller === 'otherOrg' ? DEMO.otherAdmin : DEMO[caller]) : clients[caller]
        const target = caller === 'otherOrg' && !concrete.includes(LARKSPUR) ? concrete.replace(`/orgs/${LARKSPUR}`, `/orgs/${FENWICK}`) : concrete
        const r = await client.req(method, target, method === 'GET' ? undefined : (entry!.body ?? {}))
        const ok = wanted === 'pass' ? ![401, 403, 404].includes(r.status) && r.status < 500 : r.status === wanted
        if (!ok) problems.push(`${caller}: expected ${wanted}, got ${r.status} ${JSON.stringify(r.body).slice(0, 160)}`)
        // every refusal carries a machine-readable code (shared/api-errors.ts) that the client decides on
        const code = (r.body as { data?: { code?: unknown } } | null)?.data?.code
        if (r.status >= 400 && r.status < 500 && !(API_ERROR_CODES as readonly unknown[]).includes(code)) problems.push(`${caller}: ${r.status} without a known data.code (${String(code)})`)
        // a refusal never touches the session cookie (a fresh empty one used to sign a forged request's victim out)
        if (r.status >= 400 && r.headers.getSetCookie().length) problems.push(`${caller}: ${r.status} sets a cookie: ${r.headers.getSetCookie().join(' | ')}`)
      }
      expect(problems).toEqual([])
    })
  }
})
