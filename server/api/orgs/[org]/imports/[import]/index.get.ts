import { importParamsSchema } from '#shared/schemas/route-params'
import { z } from 'zod'
import { describeImport } from '~~/server/services/imports'

const querySchema = z.object({ sheet: z.string().max(200).optional(), headerRow: z.coerce.number().int().min(0).optional() })

export default defineEventHandler(async (event) => {
  const access = await requirePermission(event, 'tables:edit')
  const { import: id } = readValidParams(event, importParamsSchema)
  const { sheet, headerRow } = readValidQuery(event, querySchema)
  return describeImport(access, id, sheet, headerRow, requestSignal(event))
})
