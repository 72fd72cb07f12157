import { versionParamsSchema } from '#shared/schemas/route-params'
import { gridFillSchema } from '#shared/schemas/grid-fills'
import { saveGridFill } from '~~/server/services/grid-fills'

// Records one choice as the two-way draft's fill: the engine runs again on the stored cells, under the draft's lock.
export default defineEventHandler(async (event) => {
  const access = await requirePermission(event, 'fills:run')
  const { table, version } = readValidParams(event, versionParamsSchema)
  const input = await readValidBody(event, gridFillSchema)
  return saveGridFill(event, access, table, version, input, requestSignal(event))
})
