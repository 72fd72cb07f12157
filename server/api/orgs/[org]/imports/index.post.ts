import { IMPORT_LIMITS } from '../../../../lib/import/limits'
import { createImport, refusal } from '../../../../services/imports'
import { readUpload } from '../../../../services/upload'

// Body: multipart/form-data with one field "file" (.xlsx or .csv). Counted as it arrives.
export default defineEventHandler(async (event) => {
  const access = await requirePermission(event, 'tables:edit')
  const { fileName, data } = await readUpload(event, IMPORT_LIMITS.uploadBytes).catch(refusal)
  setResponseStatus(event, 201)
  return createImport(event, access, fileName, data)
})
