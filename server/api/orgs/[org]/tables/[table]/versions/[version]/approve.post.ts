import { versionParamsSchema } from '#shared/schemas/route-params'
import { decideSchema } from '#shared/schemas/reviews'
import { approveVersion } from '~~/server/services/reviews'

// Signs off someone else's version (never your own: 403); the table's previous signed-off version is withdrawn.
export default defineEventHandler(async (event) => {
  const access = await requirePermission(event, 'reviews:decide')
  const { table, version } = readValidParams(event, versionParamsSchema)
  const { comment } = await readValidBody(event, decideSchema)
  return approveVersion(event, access, table, version, comment)
})
