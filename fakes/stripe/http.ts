import type { IncomingMessage, ServerResponse } from 'node:http'
import { StripeApiError } from './errors.ts'

const MAX_BODY = 1024 * 1024

export function readBody(req: IncomingMessage): Promise<string> {
  return new Promise((resolve, reject) => {
    let size = 0
    const chunks: Buffer[] = []
    req.on('data', (c: Buffer) => {
      size += c.length
      if (size > MAX_BODY) { reject(new StripeApiError(413, { type: 'invalid_request_error', message: 'Request body too large.' })); req.destroy(); return }
      chunks.push(c)
    })
    req.on('end', () => resolve(Buffer.concat(chunks).toString('utf8')))
    req.on('error', reject)
  })
}

export function sendJson(res: ServerResponse, status: number, body: unknown, headers: Record<string, string> = {}): void {
  const text = typeof body === 'string' ? body : JSON.stringify(body)
  res.writeHead(status, { 'Content-Type': 'application/json', 'Cache-Control': 'no-store', ...headers })
  res.end(text)
}

export function sendHtml(res: ServerResponse, status: number, html: string): void {
  res.writeHead(status, { 'Content-Type': 'text/html; charset=utf-8', 'Cache-Control': 'no-store', 'Content-Security-Policy': "default-src 'none'; style-src 'unsafe-inline'; form-action *" })
  res.end(html)
}

export function redirect(res: ServerResponse, location: string): void {
  res.writeHead(303, { Location: location })
  res.end()
}

export function errorBody(err: StripeApiError, requestId: string): unknown {
  return { error: { ...err.body, request_log_url: `https://dashboard.stripe.com/test/logs/${requestId}` } }
}
