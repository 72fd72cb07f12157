import { importParamsSchema } from '#shared/schemas/route-params'
import { importMatrixSchema } from '#shared/schemas/import-matrix'
import { previewMatrix } from '~~/server/services/import-matrix'
import { withImportSlot } from '~~/server/services/import-slots'

// Checks a matrix sheet (rows down, durations across, an ultimate column) against the mapping: findings by cell, counts.
export default defineEventHandler(async (event) => {
  const access = await requirePermission(event, 'tables:edit')
  const { import: id } = readValidParams(event, importParamsSchema)
  const mapping = await readValidBody(event, importMatrixSchema)
  return withImportSlot(event, access.user.id, 'preview', () => previewMatrix(access, id, mapping, requestSignal(event)))
})
