import { closePool } from '~~/server/lib/work/pool'
import { stopRunner } from '~~/server/services/work/runner'

// On shutdown (SIGTERM, SIGINT): hand this node's runs back to the queue, stop the worker threads, then close PostgreSQL.
export default defineNitroPlugin((nitro) => {
  nitro.hooks.hook('close', async () => {
    await stopRunner().catch(e => console.error('[runs] stop:', (e as Error).message))
    await closePool()
    await closeRawPool()
    await closeDb()
  })
})
