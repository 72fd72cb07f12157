import { versionParamsSchema } from '#shared/schemas/route-params'
import { sendBackSchema } from '#shared/schemas/reviews'
import { sendBack } from '~~/server/services/reviews'

// Returns a version awaiting a second check to its maker as a working draft, with a comment.
export default defineEventHandler(async (event) => {
  const access = await requirePermission(event, 'reviews:decide')
  const { table, version } = readValidParams(event, versionParamsSchema)
  const { comment } = await readValidBody(event, sendBackSchema)
  return sendBack(event, access, table, version, comment)
})
