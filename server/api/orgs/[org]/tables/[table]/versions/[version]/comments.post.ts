import { versionParamsSchema } from '#shared/schemas/route-params'
import { commentSchema } from '#shared/schemas/reviews'
import { commentOn } from '~~/server/services/reviews'

// Adds a comment to a version's thread.
export default defineEventHandler(async (event) => {
  const access = await requirePermission(event, 'reviews:submit')
  const { table, version } = readValidParams(event, versionParamsSchema)
  const { body } = await readValidBody(event, commentSchema)
  return commentOn(event, access, table, version, body)
})
