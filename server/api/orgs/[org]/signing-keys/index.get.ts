import { listSigningKeys } from '~~/server/services/signing-keys'

// The organisation's current and retired Ed25519 public keys as a JWK set (every member may read them).
export default defineEventHandler(async (event) => {
  const { org } = await requirePermission(event, 'tables:read')
  return { keys: await listSigningKeys(org.id) }
})
