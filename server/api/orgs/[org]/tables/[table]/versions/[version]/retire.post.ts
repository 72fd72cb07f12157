import { versionParamsSchema } from '#shared/schemas/route-params'
import { retireSchema } from '#shared/schemas/reviews'
import { retireVersion } from '~~/server/services/reviews'

// Withdraws a signed-off version (its values stay as they were; only its state changes).
export default defineEventHandler(async (event) => {
  const access = await requirePermission(event, 'reviews:decide')
  const { table, version } = readValidParams(event, versionParamsSchema)
  const { reason } = await readValidBody(event, retireSchema)
  return retireVersion(event, access, table, version, reason)
})
