import { versionParamsSchema } from '#shared/schemas/route-params'
import { graduatedDraftSchema } from '#shared/schemas/graduation'
import { makeGraduatedDraft } from '~~/server/services/graduation'

// Makes the graduation of this version a new working draft, with reasons (audited; a source draft is withdrawn, superseded).
export default defineEventHandler(async (event) => {
  const access = await requirePermission(event, 'tables:edit')
  const { table, version } = readValidParams(event, versionParamsSchema)
  const input = await readValidBody(event, graduatedDraftSchema)
  setResponseStatus(event, 201)
  return makeGraduatedDraft(event, access, table, version, input, requestSignal(event))
})
