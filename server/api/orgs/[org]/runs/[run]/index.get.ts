import { runParamsSchema } from '#shared/schemas/route-params'
import type { RunDto } from '#shared/types/runs'
import { findRun } from '~~/server/services/work/runs'

// One of the caller's runs (a comparison, reading an upload): where it is, on any node. 404 for anyone else's.
export default defineEventHandler(async (event): Promise<RunDto> => {
  const access = await requireMember(event)
  const { run } = readValidParams(event, runParamsSchema)
  return (await findRun(access, run)).dto
})
