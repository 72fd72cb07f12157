import { z } from 'zod'
import { versionParamsSchema } from '#shared/schemas/route-params'
import { compareSchema } from '#shared/schemas/fills'
import { compareDownload } from '~~/server/services/downloads'

const querySchema = z.object({ format: z.enum(['csv', 'xlsx']) })

// The comparison on the bench (the same body as compare) as an unsigned CSV or .xlsx, marked "not signed off": the server
// runs it again on the stored points, so the file holds exactly the engine's values, every digit.
export default defineEventHandler(async (event) => {
  const access = await requirePermission(event, 'fills:run')
  const { table, version } = readValidParams(event, versionParamsSchema)
  const { format } = readValidQuery(event, querySchema)
  const input = await readValidBody(event, compareSchema)
  const file = await compareDownload(access, table, version, input, format, requestSignal(event))
  setResponseHeader(event, 'content-type', file.contentType)
  setResponseHeader(event, 'content-disposition', `attachment; filename="${file.fileName}"`)
  return file.data
})
