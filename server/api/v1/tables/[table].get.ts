import { tableParamsSchema } from '#shared/schemas/route-params'
import { z } from 'zod'
import { readSignedTable } from '~~/server/services/signed-bodies'
import { requireReadToken } from '~~/server/services/read-tokens'

const querySchema = z.object({ version: z.coerce.number().int().positive().max(1_000_000).optional() })

// For production systems (Authorization: Bearer <read token>): the table's signed-off version (given points, chosen fill
// and its values, who made, checked and signed it off) as the content object of a signed export, with its Ed25519
// signature. Signed once per version and key and served as stored text; each read is counted for the token (per version
// and day), in the one statement that also checks the token and its rate limit. ?version=N reads an earlier signed-off
// version (to re-run a past valuation). A weak ETag is the hash of the content without its signing time: If-None-Match
// with it answers 304 while nothing in the content has changed.
export default defineEventHandler(async (event) => {
  // the token is checked inside the one statement below; a malformed request still hears 401 before 400
  if (!tableParamsSchema.safeParse(getRouterParams(event, { decode: true })).success || !querySchema.safeParse(getQuery(event)).success) await requireReadToken(event)
  const { table } = readValidParams(event, tableParamsSchema)
  const { version } = readValidQuery(event, querySchema)
  const { tag, body } = await readSignedTable(event, table, { number: version, holds: getRequestHeader(event, 'if-none-match') })
  setResponseHeader(event, 'etag', tag)
  setResponseHeader(event, 'cache-control', 'private, no-cache')
  if (body === null) {
    setResponseStatus(event, 304)
    return null
  }
  setResponseHeader(event, 'content-type', 'application/json; charset=utf-8')
  return body
})
