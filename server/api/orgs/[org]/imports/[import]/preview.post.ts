import { importParamsSchema } from '#shared/schemas/route-params'
import { importMappingSchema } from '#shared/schemas/imports'
import { previewImport } from '~~/server/services/imports'
import { withImportSlot } from '~~/server/services/import-slots'

// Every finding for a mapping (errors block, warnings can be accepted); nothing is written.
export default defineEventHandler(async (event) => {
  const access = await requirePermission(event, 'tables:edit')
  const { import: id } = readValidParams(event, importParamsSchema)
  const mapping = await readValidBody(event, importMappingSchema)
  return withImportSlot(event, access.user.id, 'preview', () => previewImport(access, id, mapping, requestSignal(event)))
})
