import { versionParamsSchema } from '#shared/schemas/route-params'
import { graduationSettingsSchema } from '#shared/schemas/graduation'
import { previewGraduation } from '~~/server/services/graduation'

// Whittaker-Henderson graduation of the version's given (crude) values with its fit tests, beside the crude values.
// Read-only: nothing is stored; POST .../graduated-draft makes it a new working draft.
export default defineEventHandler(async (event) => {
  const access = await requirePermission(event, 'fills:run')
  const { table, version } = readValidParams(event, versionParamsSchema)
  const input = await readValidBody(event, graduationSettingsSchema)
  return previewGraduation(access, table, version, input, requestSignal(event))
})
