import { runTask } from '~~/server/lib/work/pool'
import { startRunner } from '~~/server/services/work/runner'

// At start: this node joins the runs (queue, heartbeat, takeover; retried every 5 s while PostgreSQL is not there) and
// its worker threads load, so the first request does not wait for them. Stopping is in db-close.ts (before the pool closes).
export default defineNitroPlugin(() => {
  const join = () => startRunner().catch((error) => {
    console.error(`[runs] not started (${(error as Error).message}); retrying in 5 s`)
    setTimeout(join, 5000).unref()
  })
  void join()
  void runTask('describeImport', { sheetsJson: '[{"name":"warm-up","rows":[],"formulas":[],"colCount":0}]' }).catch(() => {})
})
