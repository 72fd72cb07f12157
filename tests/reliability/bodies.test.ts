import http from 'node:http'
import { describe, expect, it } from 'vitest'
import { anonymous, stack } from './helpers'
import { rssBytes, waitFor } from './stack'

// Request bodies are counted as their bytes arrive and refused past their route's limit before they are kept: an
// oversized anonymous body (1 GiB used to be read whole into memory by the sign-in and webhook routes) leaves the
// server's memory where it was.

const MiB = 1024 * 1024

/**
 * Streams up to `total` bytes to `path` as fast as the server takes them, until it answers (or closes the connection);
 * samples the server's resident memory meanwhile. `declared` sends a Content-Length, else the body is chunked.
 */
function flood(path: string, total: number, declared: boolean): Promise<{ status: number; body: string; sent: number; peakRss: number }> {
  const url = new URL(stack().baseUrl + path)
  let peakRss = rssBytes(stack().serverPid)
  const sampler = setInterval(() => { peakRss = Math.max(peakRss, rssBytes(stack().serverPid)) }, 20)
  return new Promise((resolve, reject) => {
    let status = 0
    let body = ''
    let sent = 0
    const finish = () => { clearInterval(sampler); resolve({ status, body, sent, peakRss: Math.max(peakRss, rssBytes(stack().serverPid)) }) }
    const req = http.request({ host: url.hostname, port: url.port, path: url.pathname, method: 'POST',
      headers: { 'content-type': 'application/json', 'origin': url.origin, 'x-forwarded-for': '10.250.0.1', ...(declared ? { 'content-length': total } : { 'transfer-encoding': 'chunked' }) } })
    req.on('response', (res) => {
      status = res.statusCode ?? 0
      res.setEncoding('utf8')
      res.on('data', (c: string) => { body += c })
      res.on('end', finish)
      res.on('error', finish)
    })
    req.on('error', error => (status ? finish() : (clearInterval(sampler), reject(error))))
    const chunk = Buffer.alloc(MiB, 0x20) // spaces: still not valid JSON, whatever is read
    req.write('{"email":"')
    const pump = () => {
      while (!status && sent < total) {
        sent += chunk.length
        if (!req.write(chunk)) { req.once('drain', pump); return }
      }
      if (!status) req.end()
    }
    pump()
  })
}

describe('request bodies', () => {
  for (const [label, path] of [['sign-in', '/api/auth/login'], ['Stripe webhook', '/api/webhooks/stripe'], ['an unknown address', '/api/nope']] as const) {
    it(`an anonymous 1 GiB body to ${label} is refused with 413 and leaves memory within 100 MB`, async () => {
      for (let i = 0; i < 3; i++) await anonymous().post(path, { email: 'warm@up.example' }) // settle the server's buffers first
      const before = rssBytes(stack().serverPid)
      for (const declared of [false, true]) {
        const r = await flood(path, 1024 * MiB, declared)
        expect(r.status, r.body.slice(0, 200)).toBe(413)
        expect(JSON.parse(r.body).data.code).toBe('body-too-large')
        expect(r.sent, 'the server stopped reading long before the end').toBeLessThan(1024 * MiB)
        expect(r.peakRss - before, `peak ${(r.peakRss / MiB).toFixed(0)} MiB, before ${(before / MiB).toFixed(0)} MiB`).toBeLessThan(100e6)
      }
      // and it still serves
      await waitFor('the server to answer after the flood', async () => (await anonymous().get('/api/nope')).status === 404, 30_000)
      expect(rssBytes(stack().serverPid) - before).toBeLessThan(100e6)
    })
  }

  it('a body just over the limit is refused, one under it is read', async () => {
    const client = anonymous()
    const over = await client.req('POST', '/api/auth/login', `{"email":"${'a'.repeat(300 * 1024)}"}`, { 'content-type': 'application/json' })
    expect(over.status).toBe(413)
    expect((over.body as { statusMessage: string }).statusMessage).toMatch(/larger than 256 KiB/)
    const under = await client.req('POST', '/api/auth/login', `{"email":"${'a'.repeat(200 * 1024)}"}`, { 'content-type': 'application/json' })
    expect(under.status).toBe(400) // read, then refused by validation: the address is not an e-mail address
  })

  it('JSON routes refuse other content types: the types a form can send with 403 (origin check, issue 14), others with 415', async () => {
    const client = anonymous()
    // a cross-site form can send these three without asking: refused by the same-origin middleware before any body rule
    for (const type of ['text/plain', 'application/x-www-form-urlencoded', 'multipart/form-data; boundary=x']) {
      const r = await client.req('POST', '/api/auth/login', 'email=a@b.example&password=x', { 'content-type': type })
      expect(r.status, type).toBe(403)
      expect((r.body as { data: { code: string } }).data.code, type).toBe('json-required')
    }
    const other = await client.req('POST', '/api/auth/login', 'email=a@b.example&password=x', { 'content-type': 'application/jsonp' })
    expect(other.status).toBe(415)
    expect((other.body as { data: { code: string } }).data.code).toBe('unsupported-media-type')
    const json = await client.req('POST', '/api/auth/login', '{"email":"nobody@example.test","password":"x"}', { 'content-type': 'application/json; charset=utf-8' })
    expect(json.status).toBe(401)
  })
})
