import { versionParamsSchema } from '#shared/schemas/route-params'
import { saveCellsSchema } from '#shared/schemas/two-way'
import { saveCells } from '~~/server/services/two-way'

// Saves a two-way working draft's cells; lockVersion must be the one the editor read (else 409).
export default defineEventHandler(async (event) => {
  const access = await requirePermission(event, 'tables:edit')
  const { table, version } = readValidParams(event, versionParamsSchema)
  const input = await readValidBody(event, saveCellsSchema)
  return saveCells(event, access, table, version, input)
})
