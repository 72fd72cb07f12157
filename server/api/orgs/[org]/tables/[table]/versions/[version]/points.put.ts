import { versionParamsSchema } from '#shared/schemas/route-params'
import { savePointsSchema } from '#shared/schemas/tables'
import { savePoints } from '~~/server/services/versions'

// Saves a working draft's points; lockVersion must be the one the editor read (else 409).
export default defineEventHandler(async (event) => {
  const access = await requirePermission(event, 'tables:edit')
  const { table, version } = readValidParams(event, versionParamsSchema)
  const input = await readValidBody(event, savePointsSchema)
  return savePoints(event, access, table, version, input)
})
