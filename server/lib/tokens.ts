import { createHash, randomBytes } from 'node:crypto'

/** SHA-256 (FIPS 180-4) of a token, hex: the only form in which a token is stored. */
export function hashToken(token: string): string {
  return createHash('sha256').update(token, 'utf8').digest('hex')
}

/** A 128-bit random token (base64url) for a link, and its hash to store. */
export function newToken(): { token: string; hash: string } {
  const token = randomBytes(16).toString('base64url')
  return { token, hash: hashToken(token) }
}

/** Shape check before any lookup: 16 random bytes in base64url are 22 characters. */
export function looksLikeToken(value: unknown): value is string {
  return typeof value === 'string' && /^[A-Za-z0-9_-]{22}$/.test(value)
}
