import { versionParamsSchema } from '#shared/schemas/route-params'
import { exportSignedVersion } from '~~/server/services/exports'

// The signed Excel export of a signed-off version (Ed25519 over RFC 8785 JSON of its content); writes an audit event.
export default defineEventHandler(async (event) => {
  const access = await requirePermission(event, 'exports:download')
  const { table, version } = readValidParams(event, versionParamsSchema)
  const { fileName, data } = await exportSignedVersion(event, access, table, version, requestSignal(event))
  setResponseHeaders(event, {
    'content-type': 'application/vnd.openxmlformats-officedocument.spreadsheetml.sheet',
    'content-disposition': `attachment; filename="${fileName}"`,
    'cache-control': 'no-store',
  })
  return data
})
