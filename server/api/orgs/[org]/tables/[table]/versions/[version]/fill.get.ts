import { z } from 'zod'
import { getFill } from '~~/server/services/fills'

const paramsSchema = z.object({ table: z.string().max(64), version: z.coerce.number().int().min(1).max(1_000_000) })
const querySchema = z.object({ points: z.enum(['0', '1']).optional() })

// The version's chosen fill (method, reasons, who and when); null when none. ?points=1 adds the filled values.
export default defineEventHandler(async (event) => {
  const { org } = await requirePermission(event, 'tables:read')
  const { table, version } = readValidParams(event, paramsSchema)
  const { points } = readValidQuery(event, querySchema)
  return { fill: await getFill(org.id, table, version, points === '1') }
})
