import { runParamsSchema } from '#shared/schemas/route-params'
import { findRun } from '~~/server/services/work/runs'
import { sendOutcome } from '~~/server/services/work/answer'

// The answer of one of the caller's finished runs, exactly as the request that started it would have answered (JSON);
// a failed run answers its refusal, an unfinished one 409 run-unfinished.
export default defineEventHandler(async (event) => {
  const access = await requireMember(event)
  const { run } = readValidParams(event, runParamsSchema)
  return sendOutcome(event, (await findRun(access, run)).dbId)
})
