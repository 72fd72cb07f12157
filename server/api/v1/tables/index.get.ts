import { requireReadToken } from '~~/server/services/read-tokens'
import { listSignedOffTables } from '~~/server/services/exports'
import type { ReadTableSummaryDto } from '#shared/types/read-tokens'

// For production systems (Authorization: Bearer <read token>): the organisation's tables that have a signed-off version
// (only those the token is limited to, if it is).
export default defineEventHandler(async (event): Promise<ReadTableSummaryDto[]> => {
  const { org, tableIds } = await requireReadToken(event)
  return listSignedOffTables(org.id, tableIds)
})
