import { z } from 'zod'
import { publicKeysOfSlug } from '~~/server/services/signing-keys'

const paramsSchema = z.object({ file: z.string().regex(/^[a-z0-9][a-z0-9-]{1,62}\.json$/, 'Ask for /api/keys/<organisation>.json') })

// Public, unauthenticated: an organisation's signing public keys (JWK set) at /api/keys/<slug>.json, for
// auditors outside Knotwork (docs/verify-offline.md). Public keys only; nothing secret is revealed.
export default defineEventHandler(async (event) => {
  const { file } = readValidParams(event, paramsSchema)
  const keys = await publicKeysOfSlug(file.replace(/\.json$/, ''))
  setResponseHeader(event, 'cache-control', 'public, max-age=300')
  return keys
})
