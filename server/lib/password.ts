import { randomBytes, scrypt, timingSafeEqual, type ScryptOptions } from 'node:crypto'

// OWASP Password Storage Cheat Sheet (scrypt minimum): N = 2^17, r = 8, p = 1.
const N = 2 ** 17
const r = 8
const p = 1
const KEY_LENGTH = 32
const maxmem = 256 * 1024 * 1024

function derive(plain: string, salt: Buffer, opts: ScryptOptions, keylen: number): Promise<Buffer> {
  return new Promise((resolve, reject) =>
    scrypt(plain.normalize('NFKC'), salt, keylen, { ...opts, maxmem }, (err, key) => (err ? reject(err) : resolve(key))))
}

/** PHC-style string: $scrypt$ln=17,r=8,p=1$<salt b64>$<hash b64> */
export async function hashPassword(plain: string): Promise<string> {
  const salt = randomBytes(16)
  const key = await derive(plain, salt, { N, r, p }, KEY_LENGTH)
  return `$scrypt$ln=${Math.log2(N)},r=${r},p=${p}$${salt.toString('base64')}$${key.toString('base64')}`
}

export async function verifyPassword(hash: string, plain: string): Promise<boolean> {
  const m = /^\$scrypt\$ln=(\d+),r=(\d+),p=(\d+)\$([^$]+)\$([^$]+)$/.exec(hash)
  if (!m) return false
  const expected = Buffer.from(m[5]!, 'base64')
  const key = await derive(plain, Buffer.from(m[4]!, 'base64'), { N: 2 ** Number(m[1]), r: Number(m[2]), p: Number(m[3]) }, expected.length)
  return timingSafeEqual(key, expected)
}

// Verified against when the e-mail is unknown, so both paths take the same time.
export const DUMMY_HASH = '$scrypt$ln=17,r=8,p=1$AAAAAAAAAAAAAAAAAAAAAA==$zpaxh7uLu/rXm5HnROkO3i0bJf0q1y3G5Wf6BgnsD1E='
