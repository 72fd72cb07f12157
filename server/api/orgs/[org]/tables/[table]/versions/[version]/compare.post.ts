import { versionParamsSchema } from '#shared/schemas/route-params'
import { compareSchema } from '#shared/schemas/fills'
import { startCompare } from '~~/server/services/fills'
import { answerRun } from '~~/server/services/work/answer'

// Fills the version's stored points with every chosen method and sets the results side by side (read-only; any version).
// A run kept in PostgreSQL: its progress and result can be read on any node (GET .../runs/<runId>); with
// `Prefer: respond-async` the answer is 202 at once, else the request waits and a closed connection cancels the run.
export default defineEventHandler(async (event) => {
  const access = await requirePermission(event, 'fills:run')
  const { table, version } = readValidParams(event, versionParamsSchema)
  const input = await readValidBody(event, compareSchema)
  return answerRun(event, access, await startCompare(access, table, version, input))
})
