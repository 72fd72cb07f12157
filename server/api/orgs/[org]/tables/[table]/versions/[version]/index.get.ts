import { versionParamsSchema } from '#shared/schemas/route-params'
import { getVersion } from '~~/server/services/versions'

export default defineEventHandler(async (event) => {
  const { org } = await requirePermission(event, 'tables:read')
  const { table, version } = readValidParams(event, versionParamsSchema)
  return getVersion(org.id, table, version)
})
