import { z } from 'zod'
import { savePointsSchema } from '#shared/schemas/tables'
import { savePoints } from '~~/server/services/versions'

const paramsSchema = z.object({ table: z.string().max(64), version: z.coerce.number().int().min(1).max(1_000_000) })

// Saves a working draft's points; lockVersion must be the one the editor read (else 409).
export default defineEventHandler(async (event) => {
  const access = await requirePermission(event, 'tables:edit')
  const { table, version } = readValidParams(event, paramsSchema)
  const input = await readValidBody(event, savePointsSchema)
  return savePoints(event, access, table, version, input)
})
