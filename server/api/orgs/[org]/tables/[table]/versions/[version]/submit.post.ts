import { versionParamsSchema } from '#shared/schemas/route-params'
import { submitReviewSchema } from '#shared/schemas/reviews'
import { submitForReview } from '~~/server/services/reviews'

// Freezes a filled working draft and asks the organisation's actuaries for a second check.
export default defineEventHandler(async (event) => {
  const access = await requirePermission(event, 'reviews:submit')
  const { table, version } = readValidParams(event, versionParamsSchema)
  const { note } = await readValidBody(event, submitReviewSchema)
  return submitForReview(event, access, table, version, note)
})
