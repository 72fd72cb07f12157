// Whether an error means "the database cannot be reached just now" (refused or dropped connection, a server shutting
// down, starting up or recovering after a crash) rather than a fault in the request. Such errors answer 503 with
// Retry-After (server/error-handlers/database-unavailable.ts); the pool reconnects by itself when PostgreSQL is back.

/** Sequelize's connection failures (sequelize/lib/errors/connection/*). */
const CONNECTION_ERRORS = new Set([
  'SequelizeConnectionError', 'SequelizeConnectionRefusedError', 'SequelizeConnectionAcquireTimeoutError',
  'SequelizeHostNotFoundError', 'SequelizeHostNotReachableError', 'SequelizeConnectionTimedOutError',
])
/** SQLSTATE class 08 (connection exception) and 57P01-57P03 (admin/crash shutdown, cannot connect now), PostgreSQL appendix A. */
const UNAVAILABLE_STATES = /^(08\d{3}|57P0[123])$/
const NODE_CODES = new Set(['ECONNREFUSED', 'ECONNRESET', 'EPIPE', 'ETIMEDOUT', 'EHOSTUNREACH', 'ENETUNREACH'])
const PG_MESSAGES = /Connection terminated|connection error and is not queryable|Client was closed|the database system is (starting up|shutting down|in recovery mode)|terminating connection due to/i

export const DATABASE_UNAVAILABLE_MESSAGE = 'Knotwork is briefly unavailable: its database cannot be reached just now. Try again in a minute; work you saved before is kept.'
export const DATABASE_RETRY_AFTER_SECONDS = 15

interface ErrorLike { name?: unknown; code?: unknown; message?: unknown; cause?: unknown; parent?: unknown; original?: unknown }

/** The error and what it wraps (h3's cause, Sequelize's parent / original), a few levels deep. */
function unwrap(error: unknown, out: ErrorLike[] = [], depth = 0): ErrorLike[] {
  if (!error || typeof error !== 'object' || depth > 5 || out.includes(error as ErrorLike)) return out
  const e = error as ErrorLike
  out.push(e)
  for (const inner of [e.cause, e.parent, e.original]) unwrap(inner, out, depth + 1)
  return out
}

const unavailable = (e: ErrorLike) =>
  (typeof e.name === 'string' && CONNECTION_ERRORS.has(e.name))
  || (typeof e.code === 'string' && (UNAVAILABLE_STATES.test(e.code) || NODE_CODES.has(e.code)))
  || (typeof e.message === 'string' && PG_MESSAGES.test(e.message))

/** True for a database error (Sequelize's, somewhere in the chain) that says the database cannot be reached now. */
export function isDatabaseUnavailable(error: unknown): boolean {
  const chain = unwrap(error)
  return chain.some(e => typeof e.name === 'string' && e.name.startsWith('Sequelize')) && chain.some(unavailable)
}
