import { closePool } from '~~/server/lib/work/pool'
import { stopRunner } from '~~/server/services/work/runner'

// On shutdown (SIGTERM, SIGINT): hand this node's runs back to the queue, stop the worker threads, then close PostgreSQL.
export default defineNitroPlugin((nitro) => {
  // Set the models up at start (synchronous; no connection opens before the first query), so a handler may use a model
  // before anything has called useDb(): a fresh server's first request used to fail when it was such a handler.
  if (useRuntimeConfig().databaseUrl) useDb()
  nitro.hooks.hook('close', async () => {
    await stopRunner().catch(e => console.error('[runs] stop:', (e as Error).message))
    await closePool()
    await closeRawPool()
    await closeDb()
  })
})
