
// 429 after 10 failed sign-ins in 15 minutes, per account and per address; the window
// slides, so there is no permanent lockout.
const WINDOW_MS = 15 * 60 * 1000
const LIMIT = 10

function keys(email: string, ip: string) {
  return [`account:${email}`, `address:${ip}`]
}

/** Seconds until a sign-in may be tried again, or 0 when it may be tried now. */
export async function loginRetryAfter(email: string, ip: string): Promise<number> {
  const since = new Date(Date.now() - WINDOW_MS)
  const rows = await useDb().query<{ key: string; n: string; oldest: Date }>(
    `SELECT key, count(*) AS n, min(failed_at) AS oldest FROM (
       SELECT key, failed_at, row_number() OVER (PARTITION BY key ORDER BY failed_at DESC) AS rn
       FROM login_failures WHERE key IN (:keys) AND failed_at > :since) recent
     WHERE rn <= :limit GROUP BY key`,
    { replacements: { keys: keys(email, ip), since, limit: LIMIT }, type: 'SELECT' as never })
  let wait = 0
  for (const row of rows) {
    if (Number(row.n) >= LIMIT) wait = Math.max(wait, Math.ceil((new Date(row.oldest).getTime() + WINDOW_MS - Date.now()) / 1000))
  }
  return wait
}

export async function recordLoginFailure(email: string, ip: string) {
  const db = useDb()
  await db.query('INSERT INTO login_failures (key) VALUES (:a), (:b)', { replacements: { a: keys(email, ip)[0], b: keys(email, ip)[1] } })
  await db.query('DELETE FROM login_failures WHERE failed_at < :cutoff', { replacements: { cutoff: new Date(Date.now() - 2 * WINDOW_MS) } })
}

export async function clearAccountFailures(email: string) {
  await useDb().query('DELETE FROM login_failures WHERE key = :key', { replacements: { key: `account:${email}` } })
}

