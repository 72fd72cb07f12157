import { tableParamsSchema } from '#shared/schemas/route-params'
import { z } from 'zod'
import { requireReadToken } from '~~/server/services/read-tokens'
import { signedOffPayload } from '~~/server/services/exports'

const querySchema = z.object({ version: z.coerce.number().int().positive().max(1_000_000).optional() })

// For production systems: the table's signed-off version (given points, chosen fill and its values, who made, checked and
// signed it off) as the content object of a signed export, with its Ed25519 signature; each read is in the audit trail.
// ?version=N reads an earlier signed-off version (to re-run a past valuation). A weak ETag is the hash of the content
// without its signing time: If-None-Match with it answers 304, unaudited, while nothing in the content has changed.
export default defineEventHandler(async (event) => {
  const access = await requireReadToken(event)
  const { table } = readValidParams(event, tableParamsSchema)
  const { version } = readValidQuery(event, querySchema)
  if (access.tableIds && !access.tableIds.includes(table.toLowerCase())) notFound('table') // outside the token's tables: as if absent
  const { tag, payload } = await signedOffPayload(event, access.org, table, { number: version, holds: getRequestHeader(event, 'if-none-match') })
  setResponseHeader(event, 'etag', tag)
  setResponseHeader(event, 'cache-control', 'private, no-cache')
  if (!payload) {
    setResponseStatus(event, 304)
    return null
  }
  await audit(event, { orgId: access.org.id, actor: null, action: 'read-token.read', objectType: 'table_version', objectId: payload.content.version.id,
    detail: { token: access.tokenName, table: payload.content.table.name, number: payload.content.version.number } })
  return payload
})
