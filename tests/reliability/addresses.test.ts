import { readdirSync, statSync } from 'node:fs'
import path from 'node:path'
import { beforeAll, describe, expect, it } from 'vitest'
import { API_ERROR_CODES } from '#shared/api-errors'
import type { Client } from '../api/helpers'
import { DEMO, anonymous, person } from './helpers'
import { ROOT } from './stack'

// Malformed ids and unknown addresses answer 4xx with a code, never 500 (a malformed id used to reach a ::uuid cast) and
// never the app's HTML page with 200.

/** Every route file under server/api as [METHOD, pattern]. */
function routes(dir = path.join(ROOT, 'server/api'), prefix = '/api'): [string, string][] {
  const out: [string, string][] = []
  for (const name of readdirSync(dir)) {
    const full = path.join(dir, name)
    if (statSync(full).isDirectory()) { out.push(...routes(full, `${prefix}/${name}`)); continue }
    const m = /^(.*?)\.(get|post|put|patch|delete)\.ts$/.exec(name)
    if (m) out.push([m[2]!.toUpperCase(), m[1] === 'index' ? prefix : `${prefix}/${m[1]}`])
  }
  return out
}

const MALFORMED = [
  '------------------------------------', // 36 characters, the shape of a uuid: reached PostgreSQL before
  '12345678-1234-1234-1234-12345678901g',
  'not-an-id',
  "1'%20OR%20'1'='1",
  '%00',
  'x'.repeat(300),
  '99999999999999999999',
  '-1',
  '1.5',
]
const knownCode = (body: unknown) => (API_ERROR_CODES as readonly unknown[]).includes((body as { data?: { code?: unknown } } | null)?.data?.code)

let callers: Client[]
/** headers for the read API (/api/v1/...), which takes a read token instead of a session */
let bearer: Record<string, string>
beforeAll(async () => {
  callers = [await person(DEMO.admin), await person(DEMO.actuary), await person(DEMO.analyst)]
  const token = await callers[0]!.post<{ token: string }>('/api/orgs/larkspur-mutual/read-tokens', { name: 'Reliability suite' })
  expect(token.status).toBe(201)
  bearer = { authorization: `Bearer ${token.body.token}` }
})

describe('malformed ids', () => {
  const withParams = routes().filter(([, p]) => /\[(?!org\])\w+\]/.test(p))
  it('every route with an id in its address is covered', () => {
    expect(withParams.length).toBeGreaterThan(20)
  })
  for (const [method, pattern] of withParams) {
    it(`${method} ${pattern} answers 4xx with a code for malformed ids`, async () => {
      const problems: string[] = []
      for (const bad of MALFORMED) {
        const target = pattern.replace('[org]', 'larkspur-mutual').replace(/\[\w+\]/g, bad)
        for (const client of callers) {
          const r = await client.req(method, target, method === 'GET' ? undefined : {}, target.startsWith('/api/v1/') ? bearer : {})
          if (r.status < 400 || r.status >= 500 || !knownCode(r.body)) problems.push(`${bad.slice(0, 40)}: ${r.status} ${JSON.stringify(r.body).slice(0, 120)}`)
          // a reading request for an id that cannot exist is simply not found
          if (method === 'GET' && r.status !== 404 && r.status !== 403) problems.push(`${bad.slice(0, 40)}: GET answered ${r.status}, not 404`)
        }
      }
      expect(problems).toEqual([])
    })
  }
})

describe('unknown API addresses', () => {
  const unknown = ['/api/nope', '/api/orgs/larkspur-mutual/nope', '/api/orgs/larkspur-mutual/tables/x/versions/1/nope', '/api/v1/nope', '/api']
  it('answer 404 JSON with data.code, signed in or not, whatever the client accepts', async () => {
    for (const client of [anonymous(), callers[0]!]) {
      for (const address of unknown) {
        for (const method of ['GET', 'POST', 'DELETE']) {
          for (const accept of ['application/json', 'text/html,application/xhtml+xml']) {
            const r = await client.req(method, address, method === 'POST' ? {} : undefined, { accept })
            expect(r.status, `${method} ${address} (${accept})`).toBe(404)
            expect(r.headers.get('content-type')).toMatch(/application\/json/)
            expect((r.body as { data: { code: string } }).data.code).toBe('not-found')
          }
        }
      }
    }
  })

  it('a known address asked with a method it does not serve answers 405 JSON, not the HTML page', async () => {
    for (const [method, address] of [['DELETE', '/api/me'], ['PUT', '/api/auth/login'], ['POST', '/api/orgs/larkspur-mutual/tables']]) {
      const r = await callers[0]!.req(method!, address!, method === 'DELETE' ? undefined : {}, { accept: 'text/html' })
      expect(r.status, `${method} ${address}`).toBe(405)
      expect((r.body as { data: { code: string } }).data.code).toBe('method-not-allowed')
    }
  })
})
