import { rotateSigningKey } from '~~/server/services/signing-keys'

// Retires the active signing key and creates a new one; earlier exports keep verifying against the retired key.
export default defineEventHandler(async (event) => {
  const access = await requirePermission(event, 'members:manage')
  return { keys: await rotateSigningKey(event, access) }
})
