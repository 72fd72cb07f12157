import { versionParamsSchema } from '#shared/schemas/route-params'
import { startExport } from '~~/server/services/exports'
import { answerRun } from '~~/server/services/work/answer'

// The signed Excel export of a signed-off version (Ed25519 over RFC 8785 JSON of its content); writes an audit event.
// Built as a run in a worker thread (large ones through the queue, any node): the request waits for the file, or with
// `Prefer: respond-async` answers 202 with the run to follow (GET .../runs/<id>/result then answers the file).
export default defineEventHandler(async (event) => {
  const access = await requirePermission(event, 'exports:download')
  const { table, version } = readValidParams(event, versionParamsSchema)
  return answerRun(event, access, await startExport(event, access, table, version))
})
