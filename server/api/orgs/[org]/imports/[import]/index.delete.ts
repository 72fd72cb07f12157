import { z } from 'zod'
import { deleteImport } from '~~/server/services/imports'

const paramsSchema = z.object({ import: z.string().max(64) })

export default defineEventHandler(async (event) => {
  const access = await requirePermission(event, 'tables:edit')
  const { import: id } = readValidParams(event, paramsSchema)
  await deleteImport(event, access, id)
  return { deleted: true }
})
