import { importParamsSchema } from '#shared/schemas/route-params'
import { importCommitSchema } from '#shared/schemas/imports'
import { commitImport } from '~~/server/services/imports'
import { withImportSlot } from '~~/server/services/import-slots'

// Re-validates the stored cells, then creates one table and working draft per value column.
export default defineEventHandler(async (event) => {
  const access = await requirePermission(event, 'tables:edit')
  const { import: id } = readValidParams(event, importParamsSchema)
  const { mapping, acceptWarnings } = await readValidBody(event, importCommitSchema)
  const created = await withImportSlot(event, access.user.id, 'commit', () => commitImport(event, access, id, mapping, acceptWarnings, requestSignal(event)))
  setResponseStatus(event, 201)
  return created
})
