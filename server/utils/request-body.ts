import type { H3Event } from 'h3'

/**
 * Stops reading a request body that is being refused: nothing more is kept, the rest is read and dropped for at most
 * 2 s so the client can read the answer, then the socket is destroyed. (Answering with Connection: close instead would
 * make Node close the socket as soon as the answer is out, and a client still sending gets EPIPE before it reads it.)
 */
export function stopReadingBody(event: H3Event): void {
  const req = event.node.req
  req.resume()
  if (!req.complete) setTimeout(() => req.destroy(), 2000).unref()
}

/** Whether the request carries a body at all (a length above zero, or chunked). */
export function announcesBody(event: H3Event): boolean {
  const headers = event.node.req.headers
  return Number.parseInt(headers['content-length'] ?? '', 10) > 0 || headers['transfer-encoding'] !== undefined
}

/**
 * The whole body, counted as its bytes arrive: past `limit` it stops keeping them and rejects with `tooLarge()` at
 * once (Content-Length is checked first but never trusted alone: it may be absent or lie).
 */
export function readBodyCapped(event: H3Event, limit: number, tooLarge: () => Error): Promise<Buffer> {
  const req = event.node.req
  if (Number.parseInt(req.headers['content-length'] ?? '', 10) > limit) {
    stopReadingBody(event)
    return Promise.reject(tooLarge())
  }
  return new Promise((resolve, reject) => {
    const chunks: Buffer[] = []
    let size = 0
    const done = () => {
      req.off('data', onData).off('end', onEnd).off('error', onError).off('aborted', onAborted)
    }
    const onData = (chunk: Buffer) => {
      size += chunk.length
      if (size <= limit) { chunks.push(chunk); return }
      done()
      chunks.length = 0
      stopReadingBody(event)
      reject(tooLarge())
    }
    const onEnd = () => { done(); resolve(Buffer.concat(chunks, size)) }
    const onError = (error: Error) => { done(); reject(error) }
    const onAborted = () => { done(); reject(apiError(400, 'invalid-input', 'The request was interrupted before its body arrived.')) }
    req.on('data', onData).on('end', onEnd).on('error', onError).on('aborted', onAborted)
  })
}
