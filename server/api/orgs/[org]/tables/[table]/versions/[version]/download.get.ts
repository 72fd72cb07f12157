import { z } from 'zod'
import { versionParamsSchema } from '#shared/schemas/route-params'
import { fillDownload } from '~~/server/services/downloads'

const querySchema = z.object({ format: z.enum(['csv', 'xlsx']) })

// The version's chosen fill (or its given points) as an unsigned CSV or .xlsx, marked "not signed off", every digit kept.
export default defineEventHandler(async (event) => {
  const access = await requirePermission(event, 'tables:read')
  const { table, version } = readValidParams(event, versionParamsSchema)
  const { format } = readValidQuery(event, querySchema)
  const file = await fillDownload(access, table, version, format)
  setResponseHeader(event, 'content-type', file.contentType)
  setResponseHeader(event, 'content-disposition', `attachment; filename="${file.fileName}"`)
  return file.data
})
