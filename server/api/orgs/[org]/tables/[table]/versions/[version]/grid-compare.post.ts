import { versionParamsSchema } from '#shared/schemas/route-params'
import { gridCompareSchema } from '#shared/schemas/grid-fills'
import { compareGrid } from '~~/server/services/grid-fills'

// Two-way fill bench: every choice of a method per axis on the version's stored cells, side by side (read-only).
export default defineEventHandler(async (event) => {
  const access = await requirePermission(event, 'fills:run')
  const { table, version } = readValidParams(event, versionParamsSchema)
  const input = await readValidBody(event, gridCompareSchema)
  return compareGrid(access, table, version, input, requestSignal(event))
})
