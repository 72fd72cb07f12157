import { z } from 'zod'
import { importCommitSchema } from '#shared/schemas/imports'
import { commitImport } from '~~/server/services/imports'

const paramsSchema = z.object({ import: z.string().max(64) })

// Re-validates the stored cells, then creates one table and working draft per value column.
export default defineEventHandler(async (event) => {
  const access = await requirePermission(event, 'tables:edit')
  const { import: id } = readValidParams(event, paramsSchema)
  const { mapping, acceptWarnings } = await readValidBody(event, importCommitSchema)
  setResponseStatus(event, 201)
  return commitImport(event, access, id, mapping, acceptWarnings)
})
