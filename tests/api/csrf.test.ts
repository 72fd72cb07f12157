import { existsSync, readFileSync } from 'node:fs'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { BASE, Client, DEMO, LARKSPUR, ORIGIN, closeOwnerDb, count, postRefusable, signedIn, type Reply } from './helpers'
import { ROUTES } from './route-matrix/index'
import { lookupIds } from './route-matrix/ids'
import type { Caller, MatrixContext } from './route-matrix/types'

// Cross-site request forgery, for every route that changes something (the route matrix's csrf column): a signed-in
// person's browser is made to send the change from another origin, another port of this host, with no Origin, or as a
// simple form. Each is refused with 403 by server/middleware/01.same-origin.ts before the handler runs, and the refusal
// leaves the session cookie alone.
const url = new URL(BASE)
const FORGED: { name: string; headers: Record<string, string>; form?: boolean }[] = [
  { name: 'another site', headers: { 'origin': 'https://forms.example', 'sec-fetch-site': 'cross-site' } },
  { name: 'another port of this host', headers: { 'origin': `${url.protocol}//${url.hostname}:${Number(url.port) + 1}`, 'sec-fetch-site': 'same-site' } },
  { name: 'this port under another host name', headers: { origin: `${url.protocol}//localhost:${url.port}` } },
  { name: 'no Origin and no Sec-Fetch-Site', headers: { origin: '' } },
  { name: 'no Origin, Sec-Fetch-Site same-site', headers: { 'origin': '', 'sec-fetch-site': 'same-site' } },
  { name: 'Origin null (a sandboxed frame), cross-site', headers: { 'origin': 'null', 'sec-fetch-site': 'cross-site' } },
  { name: 'a simple form from another site', headers: { 'origin': 'https://forms.example', 'sec-fetch-site': 'cross-site', 'content-type': 'application/x-www-form-urlencoded' }, form: true },
  { name: 'a text/plain form from another port', headers: { 'origin': `${url.protocol}//${url.hostname}:${Number(url.port) + 1}`, 'content-type': 'text/plain' }, form: true },
]
/** Same origin, but a body of a type any page can send without asking: refused on JSON routes. */
const FORM_BODIES: { name: string; type: string; body: string }[] = [
  { name: 'form-urlencoded', type: 'application/x-www-form-urlencoded', body: 'email=someone%40forms.example&role=admin' },
  { name: 'text/plain holding JSON', type: 'text/plain', body: '{"email":"someone@forms.example","role":"admin"}' },
  { name: 'multipart form', type: 'multipart/form-data; boundary=kw', body: '--kw\r\nContent-Disposition: form-data; name="role"\r\n\r\nadmin\r\n--kw--\r\n' },
]

const mutating = Object.entries(ROUTES).filter(([key]) => !key.startsWith('GET '))
const clients = {} as Record<Caller, Client>
let ctx: MatrixContext

/** The caller for whom the route gets past authentication and authorisation (so only the forgery check can refuse). */
function callerFor(expect: Record<Caller, unknown>): Caller {
  return (['admin', 'actuary', 'analyst', 'auditor', 'anonymous'] as Caller[]).find(c => expect[c] === 'pass') ?? 'admin'
}

const code = (r: Reply) => (r.body as { data?: { code?: string } } | null)?.data?.code

beforeAll(async () => {
  clients.anonymous = new Client()
  for (const c of ['admin', 'actuary', 'analyst', 'auditor'] as const) clients[c] = await signedIn(DEMO[c])
  ctx = { org: LARKSPUR, ids: await lookupIds(LARKSPUR) }
})
afterAll(closeOwnerDb)

describe('cross-site request forgery', () => {
  it('every route that changes something declares how it is protected (route matrix, csrf column)', () => {
    expect(mutating.filter(([, entry]) => !entry.csrf).map(([key]) => key)).toEqual([])
    expect(mutating.filter(([, entry]) => entry.csrf === 'exempt').map(([key]) => key)).toEqual(['POST /api/webhooks/stripe'])
    // a handler that reads an upload is a multipart route, and only those are
    const readsUpload = (key: string) => {
      const [method, route] = key.split(' ') as [string, string]
      const base = `server${route}`
      const file = [`${base}.${method.toLowerCase()}.ts`, `${base}/index.${method.toLowerCase()}.ts`].find(f => existsSync(f))!
      return readFileSync(file, 'utf8').includes('readUpload(')
    }
    expect(mutating.filter(([key]) => readsUpload(key)).map(([key]) => key).sort())
      .toEqual(mutating.filter(([, entry]) => entry.csrf === 'multipart').map(([key]) => key).sort())
  })

  for (const [key, entry] of mutating) {
    it(`${key} (${entry.csrf})`, async () => {
      const [method, pattern] = key.split(' ') as [string, string]
      const path = entry.path ? await entry.path(ctx) : pattern.replace('[org]', LARKSPUR)
      const caller = callerFor(entry.expect)
      const client = clients[caller]
      const cookieBefore = client.cookie
      const problems: string[] = []
      for (const forged of FORGED) {
        const r = await client.req(method, path, forged.form ? 'email=someone%40forms.example&role=admin' : (entry.body ?? {}), forged.headers)
        const refused = r.status === 403 && code(r) === 'cross-origin'
        if (entry.csrf === 'exempt' ? refused : !refused) problems.push(`${forged.name}: ${r.status} ${code(r)}`)
        if (refused && r.headers.getSetCookie().length) problems.push(`${forged.name}: the refusal sets a cookie`)
      }
      for (const form of FORM_BODIES) {
        const r = await client.req(method, path, form.body, { 'content-type': form.type })
        const refused = r.status === 403 && code(r) === 'json-required'
        if (entry.csrf === 'json' ? !refused : refused) problems.push(`same origin, ${form.name}: ${r.status} ${code(r)}`)
      }
      expect(problems).toEqual([])
      // the session the forged requests rode on is untouched
      expect(client.cookie).toBe(cookieBefore)
      if (caller !== 'anonymous') expect((await client.get('/api/me')).status).toBe(200)
    })
  }

  it('lets a change through when the browser vouches with Sec-Fetch-Site: same-origin and sends no Origin', async () => {
    const client = await signedIn(DEMO.analyst)
    const r = await client.post('/api/auth/password', {}, { 'origin': '', 'sec-fetch-site': 'same-origin' })
    expect(r.status).toBe(400) // past the forgery check, refused by validation
    expect(code(r)).toBe('invalid-input')
  })

  it('a forged form cannot invite an administrator, and the admin stays signed in', async () => {
    const admin = await signedIn(DEMO.admin)
    const email = `forged-${Date.now()}@forms.example`
    const r = await admin.req('POST', `/api/orgs/${LARKSPUR}/invitations`, `email=${encodeURIComponent(email)}&role=admin`, {
      'origin': `${url.protocol}//${url.hostname}:${Number(url.port) + 1}`, 'content-type': 'application/x-www-form-urlencoded', 'sec-fetch-site': 'same-site',
    })
    expect(r.status).toBe(403)
    expect(r.body).toMatchObject({ statusMessage: expect.stringContaining('did not come from a Knotwork page'), data: { code: 'cross-origin' } })
    expect(r.headers.getSetCookie()).toEqual([])
    expect(await count('SELECT 1 FROM invitations WHERE email = :email', { email })).toBe(0)
    expect((await admin.get('/api/me')).status).toBe(200)
  })

  it('refuses a large cross-origin body of any type before reading it (403, not a size or type refusal)', async () => {
    const answer = await postRefusable(clients.admin, `/api/orgs/${LARKSPUR}/signing-keys/rotate`, Buffer.alloc(3 * 1024 * 1024, 'a'), 'application/xml', { origin: 'https://forms.example' })
    expect(answer.status).toBe(403)
    expect(JSON.parse(answer.text)).toMatchObject({ data: { code: 'cross-origin' } })
  })

  it('the app\u2019s own origin (NUXT_PUBLIC_BASE_URL) is the one the test client names', () => {
    expect(ORIGIN).toBe(url.origin)
  })
})
