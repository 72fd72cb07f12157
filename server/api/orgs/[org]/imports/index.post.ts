import { z } from 'zod'
import { IMPORT_LIMITS } from '~~/server/lib/import/limits'
import { refusal, startImportRead } from '~~/server/services/imports'
import { readUpload } from '~~/server/services/upload'
import { answerRun } from '~~/server/services/work/answer'

const querySchema = z.object({ run: z.string().regex(/^[A-Za-z0-9-]{8,64}$/, { message: 'Not a run id' }).optional() })

// Body: multipart/form-data with one field "file" (.xlsx or .csv). Counted as it arrives, then read as a run (large files
// through the queue, on any node): 201 with the import, or with `Prefer: respond-async` 202 with the run to follow
// (?run=<id> names it).
export default defineEventHandler(async (event) => {
  const access = await requirePermission(event, 'tables:edit')
  const { run } = readValidQuery(event, querySchema)
  const { fileName, data } = await readUpload(event, IMPORT_LIMITS.uploadBytes).catch(refusal)
  return answerRun(event, access, await startImportRead(event, access, fileName, data, run), 201)
})
