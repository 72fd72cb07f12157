import { z } from 'zod'
import { IMPORT_LIMITS } from '~~/server/lib/import/limits'
import { refusal, startImportRead } from '~~/server/services/imports'
import { withImportSlot } from '~~/server/services/import-slots'
import { readUpload } from '~~/server/services/upload'
import { answerRun } from '~~/server/services/work/answer'

const querySchema = z.object({ run: z.string().regex(/^[A-Za-z0-9-]{8,64}$/, { message: 'Not a run id' }).optional() })

// Body: multipart/form-data with one field "file" (.xlsx or .csv), counted as it arrives once the person has a free
// import slot (429 otherwise), then read as a run (large files through the queue, on any node): 201 with the import, or
// with `Prefer: respond-async` 202 with the run to follow (?run=<id> names it; the slot is then given back at the 202).
export default defineEventHandler(async (event) => {
  const access = await requirePermission(event, 'tables:edit')
  const { run } = readValidQuery(event, querySchema)
  return withImportSlot(event, access.user.id, 'upload', async () => {
    const { fileName, data } = await readUpload(event, IMPORT_LIMITS.uploadBytes).catch(refusal)
    return answerRun(event, access, await startImportRead(event, access, fileName, data, run), 201)
  })
})
