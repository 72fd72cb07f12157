import { createServer, type Server, type ServerResponse } from 'node:http'
import type { Inbox } from './inbox.ts'
import { inboxPage } from './page.ts'

function json(res: ServerResponse, status: number, body: unknown): void {
  res.writeHead(status, { 'Content-Type': 'application/json', 'Cache-Control': 'no-store' })
  res.end(JSON.stringify(body))
}

function html(res: ServerResponse, body: string, csp: string): void {
  res.writeHead(200, { 'Content-Type': 'text/html; charset=utf-8', 'Cache-Control': 'no-store', 'Content-Security-Policy': csp })
  res.end(body)
}

/** GET /messages[?to=&subject=], GET /messages/:id, GET /messages/:id/html, DELETE /messages, GET / (inbox page), GET /_health. */
export function createInboxServer(inbox: Inbox): Server {
  return createServer((req, res) => {
    const url = new URL(req.url ?? '/', 'http://inbox.local')
    const path = url.pathname
    const m = /^\/messages\/([^/]+)(\/html)?$/.exec(path)
    if (req.method === 'GET' && path === '/_health') return json(res, 200, { ok: true, service: 'fake-smtp', pid: process.pid })
    if (req.method === 'GET' && path === '/messages') {
      return json(res, 200, inbox.list({ to: url.searchParams.get('to') ?? undefined, subject: url.searchParams.get('subject') ?? undefined }))
    }
    if (req.method === 'DELETE' && path === '/messages') { inbox.clear(); return json(res, 200, { ok: true }) }
    if (req.method === 'POST' && path === '/clear') { inbox.clear(); res.writeHead(303, { Location: '/' }); return res.end() }
    if (req.method === 'GET' && m) {
      const msg = inbox.get(m[1]!)
      if (!msg) return json(res, 404, { error: 'message not found' })
      if (!m[2]) return json(res, 200, msg)
      // Mail HTML is shown sandboxed: no scripts; links open at the top level.
      return html(res, `<base target="_top">${msg.html ?? ''}`, "default-src 'none'; img-src data: http: https:; style-src 'unsafe-inline'; sandbox allow-popups allow-popups-to-escape-sandbox allow-top-navigation-by-user-activation")
    }
    if (req.method === 'GET' && path === '/') {
      const id = url.searchParams.get('id')
      return html(res, inboxPage(inbox.list(), id ? inbox.get(id) : undefined), "default-src 'none'; style-src 'unsafe-inline'; frame-src 'self'; form-action 'self'")
    }
    json(res, 404, { error: 'not found' })
  })
}
