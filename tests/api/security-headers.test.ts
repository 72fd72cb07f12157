import { afterAll, describe, expect, it } from 'vitest'
import { BASE, Client, DEMO, DEMO_PASSWORD, closeOwnerDb, signedIn } from './helpers'

// Security headers on every kind of answer (nuxt-security, nuxt.config.ts), HSTS and the __Host- cookie only over
// HTTPS (the test server trusts X-Forwarded-Proto like X-Forwarded-For, as behind a TLS-terminating proxy).
afterAll(closeOwnerDb)

const raw = (path: string, headers: Record<string, string> = {}) => fetch(BASE + path, { headers, redirect: 'manual' })

function expectEveryResponseHeaders(res: Response, what: string) {
  expect(res.headers.get('x-content-type-options'), what).toBe('nosniff')
  expect(res.headers.get('x-frame-options'), what).toBe('DENY')
  expect(res.headers.get('referrer-policy'), what).toMatch(/^(same-origin|no-referrer)$/)
  expect(res.headers.get('x-powered-by'), what).toBeNull()
  expect(res.headers.get('strict-transport-security'), `${what} over plain HTTP`).toBeNull()
}

describe('security headers', () => {
  it('a page: a nonce-based CSP without unsafe-eval that no other site may frame, and the usual headers', async () => {
    const [a, b] = [await raw('/signin'), await raw('/signin')]
    expectEveryResponseHeaders(a, 'page')
    const csp = a.headers.get('content-security-policy') ?? ''
    const directives = Object.fromEntries(csp.split(';').map(d => d.trim()).filter(Boolean).map((d) => {
      const [name, ...sources] = d.split(/\s+/)
      return [name, sources]
    }))
    expect(directives['frame-ancestors']).toEqual(["'none'"])
    expect(directives['object-src']).toEqual(["'none'"])
    expect(directives['base-uri']).toEqual(["'none'"])
    expect(directives['script-src-attr']).toEqual(["'none'"])
    expect(directives['script-src']).toContain("'strict-dynamic'")
    expect(csp).not.toContain('unsafe-eval')
    expect(directives['script-src']).not.toContain("'unsafe-inline'")
    expect(directives['style-src-elem']).not.toContain("'unsafe-inline'")
    // a fresh nonce per answer, and every script element of the page carries it
    const nonce = /'nonce-([^']+)'/.exec(directives['script-src']!.join(' '))![1]!
    expect(/'nonce-([^']+)'/.exec(b.headers.get('content-security-policy') ?? '')![1]).not.toBe(nonce)
    const html = await a.text()
    const scripts = html.match(/<script\b[^>]*>/g) ?? []
    expect(scripts.length).toBeGreaterThan(1)
    for (const tag of scripts) expect(tag).toContain(`nonce="${nonce}"`)
    expect(a.headers.get('permissions-policy')).toMatch(/camera=\(\)/)
    expect(a.headers.get('permissions-policy')).toMatch(/geolocation=\(\)/)
    expect(a.headers.get('cross-origin-opener-policy')).toBe('same-origin')
  })

  it('JSON answers, refusals, unknown pages and static files carry them too', async () => {
    const me = await signedIn(DEMO.auditor)
    const json = await raw('/api/me', { cookie: me.cookie, 'x-forwarded-for': me.address })
    expect(json.status).toBe(200)
    expectEveryResponseHeaders(json, 'JSON')
    expect(json.headers.get('content-security-policy')).toContain("frame-ancestors 'none'")
    expect(json.headers.get('content-security-policy')).toMatch(/default-src 'none'|script-src 'none'/)
    const refused = await raw('/api/me')
    expect(refused.status).toBe(401)
    expectEveryResponseHeaders(refused, '401')
    expect(refused.headers.get('content-security-policy')).toContain("frame-ancestors 'none'")
    const forged = await fetch(`${BASE}/api/auth/logout`, { method: 'POST', headers: { origin: 'https://forms.example' } })
    expect(forged.status).toBe(403)
    expectEveryResponseHeaders(forged, 'forgery refusal')
    expectEveryResponseHeaders(await raw('/orgs/no-such-org'), 'redirect')
    const html = await (await raw('/signin')).text()
    for (const path of ['/favicon.svg', /src="(\/_nuxt\/[^"]+\.js)"/.exec(html)![1]!, '/demo/larkspur-pensioner-study-2026.csv']) {
      const file = await raw(path)
      expect(file.status, path).toBe(200)
      expectEveryResponseHeaders(file, path)
      expect(file.headers.get('content-security-policy'), path).toBe("default-src 'none'; frame-ancestors 'none'")
    }
  })

  it('over HTTPS: HSTS on every answer, and the session cookie is __Host- prefixed (Secure, Path=/, no Domain)', async () => {
    const https = { 'x-forwarded-proto': 'https' }
    for (const path of ['/signin', '/api/me', '/favicon.svg']) {
      expect((await raw(path, https)).headers.get('strict-transport-security'), path).toMatch(/^max-age=31536000; includeSubDomains$/)
    }
    const client = new Client()
    const r = await client.post('/api/auth/login', { email: DEMO.analyst, password: DEMO_PASSWORD }, https)
    expect(r.status).toBe(200)
    expect(r.headers.get('strict-transport-security')).toContain('max-age=')
    const [cookie] = r.headers.getSetCookie()
    expect(cookie).toMatch(/^__Host-knotwork-session=[^;]+;/)
    expect(cookie).toMatch(/; Secure/i)
    expect(cookie).toMatch(/; Path=\//i)
    expect(cookie).not.toMatch(/Domain=/i)
    // the prefixed cookie is the session over HTTPS; the plain name is not read there
    expect((await client.req('GET', '/api/me', undefined, https)).status).toBe(200)
    const plain = new Client()
    plain.cookie = client.cookie.replace('__Host-knotwork-session=', 'knotwork-session=')
    expect((await plain.req('GET', '/api/me', undefined, https)).status).toBe(401)
  })

  it('over plain HTTP (dev and tests on 127.0.0.1): the plain cookie name, still Secure and HttpOnly', async () => {
    const r = await new Client().post('/api/auth/login', { email: DEMO.analyst, password: DEMO_PASSWORD })
    const [cookie] = r.headers.getSetCookie()
    expect(cookie).toMatch(/^knotwork-session=[^;]+;.*HttpOnly.*Secure|^knotwork-session=[^;]+;.*Secure.*HttpOnly/i)
    expect(cookie).toMatch(/SameSite=Lax/i)
  })

  it('an anonymous request is answered without a session cookie', async () => {
    for (const path of ['/api/me', '/signin', '/api/orgs/larkspur-mutual']) {
      expect((await raw(path)).headers.getSetCookie(), path).toEqual([])
    }
  })
})
