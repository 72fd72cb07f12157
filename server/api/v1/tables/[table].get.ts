import { z } from 'zod'
import { requireReadToken } from '../../../services/read-tokens'
import { signedOffPayload } from '../../../services/exports'

const paramsSchema = z.object({ table: z.string().max(64) })

// For production systems: the table's signed-off version (given points, chosen fill and its values, who made, checked and
// signed it off) as the content object of a signed export, with its Ed25519 signature; each read is in the audit trail.
export default defineEventHandler(async (event) => {
  const access = await requireReadToken(event)
  const { table } = readValidParams(event, paramsSchema)
  const payload = await signedOffPayload(event, access.org, table)
  await audit(event, { orgId: access.org.id, actor: null, action: 'read-token.read', objectType: 'table_version', objectId: payload.content.version.id,
    detail: { token: access.tokenName, table: payload.content.table.name, number: payload.content.version.number } })
  return payload
})
