import pg from 'pg'

let pool: pg.Pool | undefined

/**
 * A plain pg pool for the read API's one statement per request (named, so each connection plans it once; no ORM work
 * on the hot path). Everything else goes through useDb().
 */
export function useRawPool(): pg.Pool {
  pool ??= new pg.Pool({ connectionString: useRuntimeConfig().databaseUrl, max: 10, idleTimeoutMillis: 10_000, application_name: 'knotwork-read-api' })
  return pool
}

export async function closeRawPool(): Promise<void> {
  const p = pool
  pool = undefined
  await p?.end()
}
