import { runParamsSchema } from '#shared/schemas/route-params'
import { findRun, cancelRun } from '~~/server/services/work/runs'

// Cancels one of the caller's runs on whichever node runs it (its worker thread is stopped); a finished run stays as it is.
export default defineEventHandler(async (event) => {
  const access = await requireMember(event)
  const { run } = readValidParams(event, runParamsSchema)
  const { dbId } = await findRun(access, run)
  return { status: await cancelRun(dbId) }
})
