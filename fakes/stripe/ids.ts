import { randomBytes } from 'node:crypto'

const ALPHABET = '0123456789ABCDEFGHIJKLMNOPQRSTUVWXYZabcdefghijklmnopqrstuvwxyz'

/** Random base62 string; ids look like Stripe's (`cus_` + 24 characters). */
export function randomToken(length: number): string {
  const bytes = randomBytes(length)
  let out = ''
  for (let i = 0; i < length; i++) out += ALPHABET[bytes[i]! % 62]
  return out
}

export function newId(prefix: string, length = 24): string {
  return `${prefix}_${randomToken(length)}`
}
