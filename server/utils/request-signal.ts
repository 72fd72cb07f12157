import type { H3Event } from 'h3'

/**
 * Aborted when the client goes away before the answer is sent: work in the worker pool for this request then stops
 * (its thread is ended), instead of finishing for nobody.
 */
export function requestSignal(event: H3Event): AbortSignal {
  const controller = new AbortController()
  const res = event.node.res
  res.once('close', () => { if (!res.writableEnded) controller.abort() })
  return controller.signal
}
