import { runParamsSchema } from '#shared/schemas/route-params'

// How far the caller's comparison with this run id is: methods filled so far, of how many. 404 once it is over a minute old
// or was never started by this person.
export default defineEventHandler(async (event) => {
  const { run } = readValidParams(event, runParamsSchema)
  const access = await requirePermission(event, 'fills:run')
  const progress = getProgress(access.user.id, run)
  if (!progress) throw apiError(404, 'not-found', 'No comparison with this run id is in progress.')
  return { done: progress.done, total: progress.total }
})
