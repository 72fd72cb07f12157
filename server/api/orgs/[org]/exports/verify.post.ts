import { ImportRefused } from '~~/server/lib/import/limits'
import { readUpload } from '~~/server/services/upload'
import { verifyUpload } from '~~/server/services/exports'

// A signed workbook up to this size is read (counted as the bytes arrive; the upload stops at the cap).
const MAX_BYTES = 10 * 1024 * 1024

// Checks an uploaded signed workbook (multipart, field "file"): genuine and current, genuine but superseded, altered (which cells), or unknown key.
export default defineEventHandler(async (event) => {
  const access = await requirePermission(event, 'exports:download')
  try {
    const { fileName, data } = await readUpload(event, MAX_BYTES)
    return await verifyUpload(event, access, fileName, data, requestSignal(event))
  } catch (error) {
    if (error instanceof ImportRefused) throw apiError(error.statusCode, 'import-refused', error.message)
    throw error
  }
})
