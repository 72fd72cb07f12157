import { versionParamsSchema } from '#shared/schemas/route-params'
import { saveFillSchema } from '#shared/schemas/fills'
import { saveFill } from '~~/server/services/fills'

// Makes one method the draft's fill, with the reasons; the server re-runs the engine (lockVersion must be current, else 409).
export default defineEventHandler(async (event) => {
  const access = await requirePermission(event, 'fills:run')
  const { table, version } = readValidParams(event, versionParamsSchema)
  const input = await readValidBody(event, saveFillSchema)
  return saveFill(event, access, table, version, input, requestSignal(event))
})
