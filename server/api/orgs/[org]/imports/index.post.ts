import { IMPORT_LIMITS } from '~~/server/lib/import/limits'
import { createImport, refusal } from '~~/server/services/imports'
import { withImportSlot } from '~~/server/services/import-slots'
import { readUpload } from '~~/server/services/upload'

// Body: multipart/form-data with one field "file" (.xlsx or .csv), counted as it arrives; read only once the person has
// a free import slot (429 otherwise).
export default defineEventHandler(async (event) => {
  const access = await requirePermission(event, 'tables:edit')
  return withImportSlot(event, access.user.id, 'upload', async () => {
    const { fileName, data } = await readUpload(event, IMPORT_LIMITS.uploadBytes).catch(refusal)
    setResponseStatus(event, 201)
    return createImport(event, access, fileName, data)
  })
})
