import { versionParamsSchema } from '#shared/schemas/route-params'
import { z } from 'zod'
import { getFill } from '~~/server/services/fills'

const querySchema = z.object({ points: z.enum(['0', '1']).optional() })

// The version's chosen fill (method, reasons, who and when); null when none. ?points=1 adds the filled values.
export default defineEventHandler(async (event) => {
  const { org } = await requirePermission(event, 'tables:read')
  const { table, version } = readValidParams(event, versionParamsSchema)
  const { points } = readValidQuery(event, querySchema)
  return { fill: await getFill(org.id, table, version, points === '1') }
})
