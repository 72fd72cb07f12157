import type { H3Event } from 'h3'

// Throttles kept in PostgreSQL (auth_throttles), so concurrent requests and every app node share one count.
// An attempt takes a slot BEFORE the expensive work (a password hash, a mail) runs: one INSERT ... ON CONFLICT DO UPDATE
// adds the attempt only while fewer than `limit` attempts lie in the sliding window; the row lock it takes makes
// concurrent attempts queue, so 40 simultaneous guesses take at most `limit` slots. An attempt that turns out not to be
// a failure (the right password) gives its slot back; a failure keeps it until it leaves the window.

export interface ThrottleRule { key: string; limit: number; windowSeconds: number }
export interface HeldAttempt { release(): Promise<void> }

const WINDOW = 15 * 60
/** Failed password checks per account (sign-in, current password on change, invitation with an existing account). */
export const accountRule = (email: string): ThrottleRule => ({ key: `account:${email.toLowerCase()}`, limit: 10, windowSeconds: WINDOW })
/** Failed password checks per client address, across accounts: high enough that one locked account does not lock an office. */
export const addressRule = (ip: string): ThrottleRule => ({ key: `address:${ip}`, limit: 100, windowSeconds: WINDOW })
/** Sign-up requests per client address (each sends a mail); every request counts. */
export const signupRule = (ip: string): ThrottleRule => ({ key: `signup:${ip}`, limit: 10, windowSeconds: WINDOW })
/** Password-reset requests per client address and per address asked about; every request counts. */
export const resetRules = (ip: string, email: string): ThrottleRule[] => [
  { key: `reset:${ip}`, limit: 10, windowSeconds: WINDOW },
  { key: `reset-to:${email.toLowerCase()}`, limit: 5, windowSeconds: WINDOW },
]

const PRUNE_AFTER_SECONDS = 3600 // longer than every window above
const TAKE = `
  INSERT INTO auth_throttles AS t (key, attempts, last_at) VALUES (:key, ARRAY[now()], now())
  ON CONFLICT (key) DO UPDATE
    SET attempts = ARRAY(SELECT a FROM unnest(t.attempts) a WHERE a > now() - make_interval(secs => :window) ORDER BY a) || now(),
        last_at = now()
    WHERE (SELECT count(*) FROM unnest(t.attempts) a WHERE a > now() - make_interval(secs => :window)) < :limit
  RETURNING now()::text AS slot`
const GIVE_BACK = `
  UPDATE auth_throttles SET attempts = attempts[:array_position(attempts, CAST(:slot AS timestamptz)) - 1]
                                    || attempts[array_position(attempts, CAST(:slot AS timestamptz)) + 1:]
  WHERE key = :key AND CAST(:slot AS timestamptz) = ANY (attempts)`
// seconds until the limit-th newest attempt leaves the window, i.e. until one more attempt is allowed
const WAIT = `
  SELECT ceil(extract(epoch FROM a + make_interval(secs => :window) - now()))::int AS wait
  FROM auth_throttles t, unnest(t.attempts) a
  WHERE t.key = :key AND a > now() - make_interval(secs => :window) ORDER BY a DESC OFFSET :limit - 1 LIMIT 1`

type Row = Record<string, unknown>
const select = (sql: string, replacements: Record<string, unknown>) => useDb().query<Row>(sql, { replacements, type: 'SELECT' as never }) as unknown as Promise<Row[]>

async function take(rule: ThrottleRule): Promise<string | null> {
  const rows = await select(TAKE, { key: rule.key, window: rule.windowSeconds, limit: rule.limit })
  return rows.length ? String(rows[0]!.slot) : null
}

async function giveBack(key: string, slot: string) {
  await useDb().query(GIVE_BACK, { replacements: { key, slot } })
}

let lastPrune = 0
async function pruneNow() {
  if (Date.now() - lastPrune < 600_000) return
  lastPrune = Date.now()
  await useDb().query('DELETE FROM auth_throttles WHERE last_at < now() - make_interval(secs => :age)', { replacements: { age: PRUNE_AFTER_SECONDS } })
}

/** Seconds until the rule allows another attempt (0 when it does now). */
export async function throttleWait(rule: ThrottleRule): Promise<number> {
  const rows = await select(WAIT, { key: rule.key, window: rule.windowSeconds, limit: rule.limit })
  return rows.length ? Math.max(1, Number(rows[0]!.wait)) : 0
}

/**
 * Takes one slot on every rule, in order, or none at all: at the first full rule the slots already taken are given back
 * and the request is refused with 429 and Retry-After (`what` starts the message, e.g. "Too many failed sign-ins").
 */
export async function holdAttempt(event: H3Event, rules: ThrottleRule[], what: string): Promise<HeldAttempt> {
  const taken: { key: string; slot: string }[] = []
  for (const rule of rules) {
    const slot = await take(rule)
    if (slot) { taken.push({ key: rule.key, slot }); continue }
    for (const t of taken) await giveBack(t.key, t.slot)
    const wait = await throttleWait(rule) || rule.windowSeconds
    setResponseHeader(event, 'retry-after', wait)
    throw apiError(429, 'rate-limited', `${what}. Try again in ${Math.ceil(wait / 60)} minute(s).`, { retryAfter: wait })
  }
  pruneNow().catch(error => console.error('[throttle] prune failed:', error))
  return { release: async () => { for (const t of taken) await giveBack(t.key, t.slot) } }
}

/** Empties a rule's window, e.g. an account's failed sign-ins once its owner has proved the mailbox (password reset). */
export async function clearThrottle(rule: ThrottleRule): Promise<void> {
  await useDb().query('DELETE FROM auth_throttles WHERE key = :key', { replacements: { key: rule.key } })
}
