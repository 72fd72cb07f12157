import { IMPORT_LIMITS } from '~~/server/lib/import/limits'
import { createImport, refusal } from '~~/server/services/imports'
import { readUpload } from '~~/server/services/upload'

// Body: multipart/form-data with one field "file" (.xlsx or .csv). Counted as it arrives.
export default defineEventHandler(async (event) => {
  const access = await requirePermission(event, 'tables:edit')
  const { fileName, data } = await readUpload(event, IMPORT_LIMITS.uploadBytes).catch(refusal)
  setResponseStatus(event, 201)
  return createImport(event, access, fileName, data)
})
