// Shared helpers for API tests: they run against the built server and the throwaway
// database that scripts/test.sh prepared (KW_BASE_URL, KW_DATABASE_OWNER_URL).
import { randomBytes } from 'node:crypto'
import http from 'node:http'
import { Sequelize } from 'sequelize'
import pg from 'pg'
import { DEMO_PASSWORD, DEMO_PEOPLE, FENWICK, LARKSPUR } from '../demo-people'
import { tokenIn, waitForMail } from './inbox'

export const BASE = process.env.KW_BASE_URL ?? 'http://127.0.0.1:3000'

export { DEMO_PASSWORD, FENWICK, LARKSPUR }
export const DEMO = DEMO_PEOPLE
/** The app's own origin (scripts/test.sh sets NUXT_PUBLIC_BASE_URL to KW_BASE_URL): every change a browser makes names it. */
export const ORIGIN = new URL(BASE).origin

/**
 * A client address of its own per client (the test server trusts X-Forwarded-For), so the per-address throttles of one
 * test never meet another's: random, because a counter starts again in every test file within the 15-minute windows.
 */
function nextAddress() {
  const [a, b, c] = randomBytes(3)
  return `10.${a}.${b}.${c! % 254 + 1}`
}

export interface Reply<T = unknown> { status: number; body: T; headers: Headers }

/**
 * A person's browser on one of the app's pages (against BASE, or another server's base URL): keeps the session cookie
 * between requests and, as a browser does, names the page's origin on every change (Origin). A header given as '' is
 * left out (to send no Origin at all).
 */
export class Client {
  cookie = ''
  /** the app node this browser talks to (two-node tests switch it; the cookie goes along) */
  constructor(readonly address = nextAddress(), public base = BASE) {}

  async req<T = unknown>(method: string, path: string, body?: unknown, headers: Record<string, string> = {}): Promise<Reply<T>> {
    const isRaw = body instanceof Uint8Array || body instanceof FormData || typeof body === 'string'
    const all: Record<string, string> = {
      ...(body !== undefined && !isRaw ? { 'content-type': 'application/json' } : {}),
      ...(this.cookie ? { cookie: this.cookie } : {}),
      ...(method !== 'GET' && method !== 'HEAD' ? { origin: this.base === BASE ? ORIGIN : new URL(this.base).origin } : {}),
      'x-forwarded-for': this.address,
      'accept': 'application/json',
      ...headers,
    }
    const res = await fetch(this.base + path, {
      method,
      headers: Object.fromEntries(Object.entries(all).filter(([, v]) => v !== '')),
      body: body === undefined ? undefined : isRaw ? (body as BodyInit) : JSON.stringify(body),
      redirect: 'manual',
    })
    const set = res.headers.getSetCookie()
    for (const c of set) {
      const [pair] = c.split(';')
      const [name] = pair!.split('=')
      const rest = this.cookie.split('; ').filter(p => p && !p.startsWith(`${name}=`))
      this.cookie = /=\s*$/.test(pair!) || /Max-Age=0/i.test(c) ? rest.join('; ') : [...rest, pair].join('; ')
    }
    const text = await res.text()
    let parsed: unknown = text
    try { parsed = text ? JSON.parse(text) : null } catch { /* not JSON */ }
    return { status: res.status, body: parsed as T, headers: res.headers }
  }

  get<T = unknown>(path: string) { return this.req<T>('GET', path) }
  post<T = unknown>(path: string, body?: unknown, headers?: Record<string, string>) { return this.req<T>('POST', path, body ?? {}, headers) }

  async login(email: string, password = DEMO_PASSWORD) {
    const r = await this.post('/api/auth/login', { email, password })
    if (r.status !== 200) throw new Error(`login ${email} answered ${r.status}: ${JSON.stringify(r.body)}`)
    return this
  }
}

export async function signedIn(email: string, password = DEMO_PASSWORD, base = BASE) {
  return new Client(undefined, base).login(email, password)
}

export function uniqueEmail(prefix = 'person') {
  return `${prefix}-${randomBytes(5).toString('hex')}@example.test`
}

/**
 * A new organisation with its admin signed in, made the way a person does it: sign-up asks for the address, the link
 * arrives in the fake inbox, and completing it names the organisation and sets the password. `base`: the app node.
 */
export async function freshOrg(name = `Test Org ${randomBytes(3).toString('hex')}`, base = BASE) {
  const client = new Client(undefined, base)
  const email = uniqueEmail('admin')
  const password = 'correct horse battery staple'
  const asked = await client.post('/api/auth/signup', { email })
  if (asked.status !== 202) throw new Error(`signup answered ${asked.status}: ${JSON.stringify(asked.body)}`)
  const token = tokenIn(await waitForMail(email, 'Finish creating'), '/confirm-signup', base)
  const r = await client.post<{ memberships: { org: { slug: string; id: string } }[] }>('/api/auth/signup/complete', { token, name: 'Test Admin', password, organisation: name })
  if (r.status !== 201) throw new Error(`signup/complete answered ${r.status}: ${JSON.stringify(r.body)}`)
  return { client, email, password, slug: r.body.memberships[0]!.org.slug, orgId: r.body.memberships[0]!.org.id }
}

let sequelize: Sequelize | undefined
/** Owner connection for assertions and for tampering "behind the app's back". */
export function ownerDb(): Sequelize {
  sequelize ??= new Sequelize(process.env.KW_DATABASE_OWNER_URL!, { dialect: 'postgres', dialectModule: pg, logging: false, pool: { max: 2 } })
  return sequelize
}

export async function closeOwnerDb() {
  await sequelize?.close()
  sequelize = undefined
}

export async function count(sql: string, replacements: Record<string, unknown> = {}): Promise<number> {
  const [rows] = await ownerDb().query(`SELECT count(*)::int AS n FROM (${sql}) q`, { replacements })
  return (rows as { n: number }[])[0]!.n
}

/**
 * POST a large body that the server may refuse before reading it all: the answer is taken as soon as it arrives, and a
 * connection the server closes mid-upload (EPIPE, reset) after answering is not an error. fetch would fail in that case.
 */
export function postRefusable(client: Client, path: string, body: Buffer, contentType: string, headers: Record<string, string> = {}): Promise<{ status: number; text: string }> {
  const url = new URL(BASE + path)
  return new Promise((resolve, reject) => {
    let status = 0
    let text = ''
    const req = http.request({ host: url.hostname, port: url.port, path: url.pathname, method: 'POST', headers: { 'cookie': client.cookie, 'origin': ORIGIN, 'x-forwarded-for': client.address, 'content-type': contentType, 'content-length': body.length, ...headers } })
    req.on('response', (res) => {
      status = res.statusCode ?? 0
      res.setEncoding('utf8')
      res.on('data', (c: string) => { text += c })
      res.on('end', () => resolve({ status, text }))
      res.on('error', () => resolve({ status, text }))
    })
    req.on('error', error => (status ? resolve({ status, text }) : reject(error)))
    req.end(body)
  })
}

/** A multipart/form-data body with one file field, and its content type. */
export function multipartFile(field: string, filename: string, data: Buffer): { body: Buffer; contentType: string } {
  const boundary = `kw${randomBytes(8).toString('hex')}`
  const head = Buffer.from(`--${boundary}\r\nContent-Disposition: form-data; name="${field}"; filename="${filename}"\r\nContent-Type: application/octet-stream\r\n\r\n`)
  return { body: Buffer.concat([head, data, Buffer.from(`\r\n--${boundary}--\r\n`)]), contentType: `multipart/form-data; boundary=${boundary}` }
}
