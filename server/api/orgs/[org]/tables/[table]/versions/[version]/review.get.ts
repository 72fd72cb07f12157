import { versionParamsSchema } from '#shared/schemas/route-params'
import { reviewState } from '~~/server/services/review-queries'

// The review panel of one version: who made, filled, submitted and signed it off, the thread, and what the caller may do.
export default defineEventHandler(async (event) => {
  const access = await requirePermission(event, 'tables:read')
  const { table, version } = readValidParams(event, versionParamsSchema)
  return reviewState(access, table, version)
})
