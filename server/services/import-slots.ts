import type { H3Event } from 'h3'
import { QueryTypes } from 'sequelize'
import { IMPORT_CONCURRENT_PER_PERSON } from '#shared/import-caps'

// A person may have at most IMPORT_CONCURRENT_PER_PERSON imports being read, checked or created at once; beyond that 429
// with Retry-After, before the upload's body is read. The count lives in PostgreSQL (import_slots), taken under a
// per-person advisory lock, so it holds across concurrent requests and across app nodes. A slot is given back when the
// work ends; a node that dies holding one loses it after SLOT_MINUTES.
const SLOT_MINUTES = 3
const RETRY_AFTER_SECONDS = 10

export type ImportWork = 'upload' | 'preview' | 'commit'

async function takeSlot(userId: string, work: ImportWork): Promise<string | null> {
  return inTransaction(async (t) => {
    const db = useDb()
    await db.query(`SELECT pg_advisory_xact_lock(hashtext('import-slots:' || :userId))`, { replacements: { userId }, transaction: t })
    await db.query('DELETE FROM import_slots WHERE user_id = :userId AND expires_at <= now()', { replacements: { userId }, transaction: t })
    const [slot] = await db.query<{ id: string }>(
      `INSERT INTO import_slots (user_id, work, expires_at)
       SELECT :userId, :work, now() + make_interval(mins => :minutes)
       WHERE (SELECT count(*) FROM import_slots WHERE user_id = :userId) < :limit RETURNING id`,
      { replacements: { userId, work, minutes: SLOT_MINUTES, limit: IMPORT_CONCURRENT_PER_PERSON }, type: QueryTypes.SELECT, transaction: t })
    return slot?.id ?? null
  })
}

/** Runs `work` holding one of the person's import slots; 429 with Retry-After when they are all in use. */
export async function withImportSlot<T>(event: H3Event, userId: string, kind: ImportWork, work: () => Promise<T>): Promise<T> {
  const slot = await takeSlot(userId, kind)
  if (!slot) {
    stopReadingBody(event) // an upload's body is not read at all
    setResponseHeader(event, 'retry-after', RETRY_AFTER_SECONDS)
    throw apiError(429, 'rate-limited', `You already have ${IMPORT_CONCURRENT_PER_PERSON} imports being read or checked; wait until one has finished, then try again.`)
  }
  try {
    return await work()
  } finally {
    await useDb().query('DELETE FROM import_slots WHERE id = :slot', { replacements: { slot } })
      .catch(error => console.warn(`[import] slot ${slot} not given back (it expires in ${SLOT_MINUTES} min): ${(error as Error).message}`))
  }
}
