import type { H3Event } from 'h3'

/**
 * Runs work once the answer has left (the response's 'close' event, which follows 'finish' and also fires when the
 * client goes away), so nothing it does (a lookup, a write, a mail) can lengthen or change the answer. Used where the
 * answer must not reveal whether an address is registered: sign-up and password reset.
 */
export function afterAnswer(event: H3Event, label: string, work: () => Promise<void>): void {
  const run = () => { work().catch(error => console.error(`[${label}] after the answer: ${(error as Error).message}`)) }
  const res = event.node.res
  if (res.closed) run()
  else res.once('close', run)
}
