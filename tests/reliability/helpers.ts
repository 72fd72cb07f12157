import pg from 'pg'
import { inject } from 'vitest'
import { Client, DEMO, signedIn } from '../api/helpers'
import { killPostgres, restartPostgres, waitFor, type StackInfo } from './stack'

export const stack = (): StackInfo => inject('reliability')

/** A short-lived owner connection to the suite's database (PostgreSQL gets killed, so no pool is kept). */
export async function withOwner<T>(work: (db: pg.Client) => Promise<T>): Promise<T> {
  const db = new pg.Client({ connectionString: stack().ownerUrl })
  await db.connect()
  try {
    return await work(db)
  } finally {
    await db.end().catch(() => {})
  }
}

export const person = (email: string) => signedIn(email, undefined, stack().baseUrl)
export const anonymous = () => new Client(undefined, stack().baseUrl)
export { DEMO }

/** The app answers a signed-in request again (its pool has reconnected). */
export async function appRecovered(client: Client) {
  await waitFor('the app to answer again after PostgreSQL came back', async () => (await client.get('/api/me')).status === 200, 120_000, 200)
}

/** SIGKILL PostgreSQL, start it again (crash recovery), and wait until the app answers again. */
export async function crashAndRecover(client: Client) {
  await killPostgres(stack())
  restartPostgres(stack())
  await appRecovered(client)
}
