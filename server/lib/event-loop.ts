/**
 * A pause that lets the event loop run everything that is waiting (I/O callbacks, other requests) before resuming:
 * setImmediate runs after the poll phase, unlike a resolved promise or process.nextTick, which run before any I/O.
 */
export function yieldToEventLoop(): Promise<void> {
  return new Promise(resolve => setImmediate(resolve))
}
