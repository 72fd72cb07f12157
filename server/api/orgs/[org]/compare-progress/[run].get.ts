import { runParamsSchema } from '#shared/schemas/route-params'
import { findRun } from '~~/server/services/work/runs'

// How far the caller's comparison with this run id is: methods filled so far, of how many, and its state. Answered by any
// node (the run is kept in PostgreSQL). 404 when this person started no run with this id, or it ended over an hour ago.
export default defineEventHandler(async (event) => {
  const access = await requirePermission(event, 'fills:run')
  const { run } = readValidParams(event, runParamsSchema)
  const { dto } = await findRun(access, run)
  return { done: dto.done, total: dto.total, status: dto.status }
})
