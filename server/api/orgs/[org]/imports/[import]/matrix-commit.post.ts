import { importParamsSchema } from '#shared/schemas/route-params'
import { importMatrixCommitSchema } from '#shared/schemas/import-matrix'
import { commitMatrix } from '~~/server/services/import-matrix'
import { withImportSlot } from '~~/server/services/import-slots'

// Re-checks the matrix sheet, then creates one two-way table with working draft 1 (blank cells left to fill).
export default defineEventHandler(async (event) => {
  const access = await requirePermission(event, 'tables:edit')
  const { import: id } = readValidParams(event, importParamsSchema)
  const { mapping, acceptWarnings } = await readValidBody(event, importMatrixCommitSchema)
  const created = await withImportSlot(event, access.user.id, 'commit', () => commitMatrix(event, access, id, mapping, acceptWarnings, requestSignal(event)))
  setResponseStatus(event, 201)
  return created
})
