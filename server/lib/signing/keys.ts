import { createCipheriv, createDecipheriv, createHash, createPrivateKey, createPublicKey, generateKeyPairSync, hkdfSync, randomBytes, sign, verify, type KeyObject } from 'node:crypto'

// Ed25519 (RFC 8032) keys of an organisation. The private key is stored sealed with AES-256-GCM
// (NIST SP 800-38D) under a key derived with HKDF-SHA-256 (RFC 5869) from the server secret.

export interface PublicJwk { kty: 'OKP'; crv: 'Ed25519'; x: string; kid: string; use: 'sig'; alg: 'EdDSA' }

export function generateSigningKey(): { x: string; privatePkcs8: Buffer } {
  const { publicKey, privateKey } = generateKeyPairSync('ed25519')
  const jwk = publicKey.export({ format: 'jwk' }) as { x: string }
  return { x: jwk.x, privatePkcs8: privateKey.export({ format: 'der', type: 'pkcs8' }) }
}

/** RFC 7638 JWK thumbprint: SHA-256 over {"crv","kty","x"} in that order, base64url. Used as the key id. */
export function keyIdOf(x: string): string {
  return createHash('sha256').update(`{"crv":"Ed25519","kty":"OKP","x":"${x}"}`).digest('base64url')
}

export function publicKeyOf(x: string): KeyObject {
  return createPublicKey({ key: { kty: 'OKP', crv: 'Ed25519', x }, format: 'jwk' })
}

export function publicPem(x: string): string {
  return publicKeyOf(x).export({ format: 'pem', type: 'spki' }).toString()
}

export function publicJwk(x: string): PublicJwk {
  return { kty: 'OKP', crv: 'Ed25519', x, kid: keyIdOf(x), use: 'sig', alg: 'EdDSA' }
}

function sealingKey(secret: string, orgId: string): Buffer {
  if (secret.length < 32) throw new Error('the signing secret must have at least 32 characters (KW_SIGNING_SECRET)')
  return Buffer.from(hkdfSync('sha256', secret, 'knotwork-org-signing-keys/1', `org:${orgId}`, 32))
}

/** "v1.<iv>.<tag>.<ciphertext>" (base64url); the key id is bound as additional authenticated data. */
export function sealPrivateKey(pkcs8: Buffer, secret: string, orgId: string, kid: string): string {
  const iv = randomBytes(12)
  const cipher = createCipheriv('aes-256-gcm', sealingKey(secret, orgId), iv)
  cipher.setAAD(Buffer.from(kid))
  const body = Buffer.concat([cipher.update(pkcs8), cipher.final()])
  return ['v1', iv, cipher.getAuthTag(), body].map(p => (typeof p === 'string' ? p : p.toString('base64url'))).join('.')
}

export function openPrivateKey(sealed: string, secret: string, orgId: string, kid: string): KeyObject {
  const [v, iv, tag, body] = sealed.split('.')
  if (v !== 'v1' || !iv || !tag || !body) throw new Error('unknown sealed key format')
  const decipher = createDecipheriv('aes-256-gcm', sealingKey(secret, orgId), Buffer.from(iv, 'base64url'))
  decipher.setAAD(Buffer.from(kid))
  decipher.setAuthTag(Buffer.from(tag, 'base64url'))
  const der = Buffer.concat([decipher.update(Buffer.from(body, 'base64url')), decipher.final()])
  return createPrivateKey({ key: der, format: 'der', type: 'pkcs8' })
}

/** Pure Ed25519 signature (no pre-hash): crypto.sign with a null algorithm. */
export function signBytes(data: Buffer, privateKey: KeyObject): string {
  return sign(null, data, privateKey).toString('base64')
}

export function verifyBytes(data: Buffer, signatureB64: string, x: string): boolean {
  try {
    const sig = Buffer.from(signatureB64, 'base64')
    return sig.length === 64 && verify(null, data, publicKeyOf(x), sig)
  } catch {
    return false
  }
}
