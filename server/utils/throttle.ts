// Sliding-window throttles kept in PostgreSQL (login_failures), so they hold across restarts and processes.
// Sign-in: 429 after 10 failures in 15 minutes, per account and per address. Sign-up: 429 after 10 refused sign-ups
// (an address already registered) in 15 minutes from one address, which caps how fast anyone can probe for accounts.
// The window slides, so there is no permanent lockout.
const WINDOW_MS = 15 * 60 * 1000
const LIMIT = 10

function loginKeys(email: string, ip: string) {
  return [`account:${email}`, `address:${ip}`]
}

/** Seconds until any of the keys is below the limit again, or 0 when none is at the limit. */
async function retryAfter(keys: string[]): Promise<number> {
  const since = new Date(Date.now() - WINDOW_MS)
  const rows = await useDb().query<{ key: string; n: string; oldest: Date }>(
    `SELECT key, count(*) AS n, min(failed_at) AS oldest FROM (
       SELECT key, failed_at, row_number() OVER (PARTITION BY key ORDER BY failed_at DESC) AS rn
       FROM login_failures WHERE key IN (:keys) AND failed_at > :since) recent
     WHERE rn <= :limit GROUP BY key`,
    { replacements: { keys, since, limit: LIMIT }, type: 'SELECT' as never })
  let wait = 0
  for (const row of rows) {
    if (Number(row.n) >= LIMIT) wait = Math.max(wait, Math.ceil((new Date(row.oldest).getTime() + WINDOW_MS - Date.now()) / 1000))
  }
  return wait
}

async function recordFailure(keys: string[]) {
  const db = useDb()
  await db.query(`INSERT INTO login_failures (key) VALUES ${keys.map((_, i) => `(:k${i})`).join(', ')}`, { replacements: Object.fromEntries(keys.map((k, i) => [`k${i}`, k])) })
  await db.query('DELETE FROM login_failures WHERE failed_at < :cutoff', { replacements: { cutoff: new Date(Date.now() - 2 * WINDOW_MS) } })
}

/** Seconds until a sign-in may be tried again, or 0 when it may be tried now. */
export function loginRetryAfter(email: string, ip: string): Promise<number> {
  return retryAfter(loginKeys(email, ip))
}

export function recordLoginFailure(email: string, ip: string) {
  return recordFailure(loginKeys(email, ip))
}

export async function clearAccountFailures(email: string) {
  await useDb().query('DELETE FROM login_failures WHERE key = :key', { replacements: { key: `account:${email}` } })
}

/** Seconds until this address may try to sign up again, or 0. */
export function signupRetryAfter(ip: string): Promise<number> {
  return retryAfter([`signup:${ip}`])
}

export function recordSignupRefusal(ip: string) {
  return recordFailure([`signup:${ip}`])
}
