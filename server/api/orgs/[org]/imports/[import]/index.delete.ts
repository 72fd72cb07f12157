import { importParamsSchema } from '#shared/schemas/route-params'
import { deleteImport } from '~~/server/services/imports'

export default defineEventHandler(async (event) => {
  const access = await requirePermission(event, 'tables:edit')
  const { import: id } = readValidParams(event, importParamsSchema)
  await deleteImport(event, access, id)
  return { deleted: true }
})
