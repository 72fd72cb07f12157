import { z } from 'zod'
import { saveFillSchema } from '#shared/schemas/fills'
import { saveFill } from '~~/server/services/fills'

const paramsSchema = z.object({ table: z.string().max(64), version: z.coerce.number().int().min(1).max(1_000_000) })

// Makes one method the draft's fill, with the reasons; the server re-runs the engine (lockVersion must be current, else 409).
export default defineEventHandler(async (event) => {
  const access = await requirePermission(event, 'fills:run')
  const { table, version } = readValidParams(event, paramsSchema)
  const input = await readValidBody(event, saveFillSchema)
  return saveFill(event, access, table, version, input)
})
