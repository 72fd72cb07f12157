import { z } from 'zod'
import { verifyAudit } from '~~/server/services/audit-verify'
import { publicKeyById } from '~~/server/services/signing-keys'

// A head the reader holds (from a signed file, a read-API answer or a CSV): its number and hash, both or neither.
const querySchema = z.object({
  number: z.coerce.number().int().min(1).max(Number.MAX_SAFE_INTEGER).optional(),
  hash: z.string().trim().toLowerCase().regex(/^[0-9a-f]{64}$/, 'A hash is the 64 hexadecimal characters of a SHA-256').optional(),
}).refine(q => (q.number === undefined) === (q.hash === undefined), { path: ['hash'], message: 'Give the event number and its hash together' })

// Walks the organisation's hash chain (and the system chain of sign-ins), checks the numbering, and compares the trail
// with its signed checkpoints and with a head given by the reader; names the first broken link and any missing events.
export default defineEventHandler(async (event) => {
  const { org } = await requirePermission(event, 'tables:read')
  const { number, hash } = readValidQuery(event, querySchema)
  return verifyAudit(org, kid => publicKeyById(org.id, kid), number !== undefined && hash ? { number, hash } : undefined)
})
