import { z } from '#shared/zod'
import { versionParamsSchema } from '#shared/schemas/route-params'
import { getGridFill } from '~~/server/services/grid-fills'

const querySchema = z.object({ cells: z.enum(['0', '1']).default('0') })

// A two-way version's chosen fill: settings in words, checks, money; with ?cells=1 its filled values.
export default defineEventHandler(async (event) => {
  const access = await requirePermission(event, 'tables:read')
  const { table, version } = readValidParams(event, versionParamsSchema)
  const { cells } = readValidQuery(event, querySchema)
  return { fill: await getGridFill(access.org.id, table, version, cells === '1') }
})
