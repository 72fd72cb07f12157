import type { H3Event } from 'h3'
import { QueryTypes, type Transaction } from 'sequelize'
import type { KeyObject } from 'node:crypto'
import { generateSigningKey, keyIdOf, openPrivateKey, publicJwk, sealPrivateKey, type PublicJwk } from '../lib/signing'
import type { OrgAccess } from '../utils/auth'
import { Organisation } from '../database/models'

// Each organisation's Ed25519 key pair: created on first export, rotated by retiring the active
// key and creating a new one. Retired public keys stay published so older exports still verify.
export interface SigningKeyDto extends PublicJwk { status: 'active' | 'retired'; createdAt: string; retiredAt: string | null }

function secret(): string {
  const s = String(useRuntimeConfig().signingSecret || '')
  if (s.length < 32) throw apiError(503, 'not-configured', 'Signing is not configured on this server (NUXT_SIGNING_SECRET of at least 32 characters). Start it through npm start.')
  return s
}

async function createKey(orgId: string, t: Transaction): Promise<{ kid: string; x: string }> {
  const { x, privatePkcs8 } = generateSigningKey()
  const kid = keyIdOf(x)
  await useDb().query('INSERT INTO org_signing_keys (org_id, kid, public_x, private_sealed) VALUES (:orgId, :kid, :x, :sealed)',
    { replacements: { orgId, kid, x, sealed: sealPrivateKey(privatePkcs8, secret(), orgId, kid) }, transaction: t })
  return { kid, x }
}

/** The active key (created now when the organisation has none), with its private key opened. `event`: who asked, for the audit trail. */
export async function activeSigningKey(event: H3Event | null, orgId: string): Promise<{ kid: string; x: string; privateKey: KeyObject }> {
  const key = await inTransaction(async (t) => {
    await useDb().query('SELECT pg_advisory_xact_lock(hashtext(:k))', { replacements: { k: `signing-key:${orgId}` }, transaction: t })
    const [row] = await useDb().query<{ kid: string; public_x: string; private_sealed: string }>(
      'SELECT kid, public_x, private_sealed FROM org_signing_keys WHERE org_id = :orgId AND status = \'active\'', { replacements: { orgId }, type: QueryTypes.SELECT, transaction: t })
    if (row) return { kid: row.kid, x: row.public_x, sealed: row.private_sealed }
    const created = await createKey(orgId, t)
    await audit(event, { orgId, action: 'signing-key.create', objectType: 'signing_key', objectId: created.kid, detail: { kid: created.kid } }, t)
    const [fresh] = await useDb().query<{ private_sealed: string }>('SELECT private_sealed FROM org_signing_keys WHERE kid = :kid', { replacements: { kid: created.kid }, type: QueryTypes.SELECT, transaction: t })
    return { ...created, sealed: fresh!.private_sealed }
  })
  return { kid: key.kid, x: key.x, privateKey: openSealedKey(orgId, key.kid, key.sealed) }
}

// Opened private keys by key id: a key never changes once made, so a node opens each once (the read API's hot path
// signs the trail's head with it on every answer). Only this process's copy; the sealed key stays in PostgreSQL.
const opened = new Map<string, KeyObject>()

/** A sealed private key (org_signing_keys.private_sealed) opened with this server's signing secret. */
export function openSealedKey(orgId: string, kid: string, sealed: string): KeyObject {
  let key = opened.get(kid)
  if (!key) {
    key = openPrivateKey(sealed, secret(), orgId, kid)
    opened.set(kid, key)
  }
  return key
}

export async function listSigningKeys(orgId: string): Promise<SigningKeyDto[]> {
  const rows = await useDb().query<{ public_x: string; status: 'active' | 'retired'; created_at: string; retired_at: string | null }>(
    'SELECT public_x, status, created_at, retired_at FROM org_signing_keys WHERE org_id = :orgId ORDER BY created_at DESC', { replacements: { orgId }, type: QueryTypes.SELECT })
  return rows.map(r => ({ ...publicJwk(r.public_x), status: r.status, createdAt: new Date(r.created_at).toISOString(), retiredAt: r.retired_at ? new Date(r.retired_at).toISOString() : null }))
}

/** Every public key (x) of this organisation by key id, current and retired: what a workbook may be signed with. */
export async function publicKeysOf(orgId: string): Promise<Record<string, string>> {
  const rows = await useDb().query<{ kid: string; public_x: string }>('SELECT kid, public_x FROM org_signing_keys WHERE org_id = :orgId', { replacements: { orgId }, type: QueryTypes.SELECT })
  return Object.fromEntries(rows.map(r => [r.kid, r.public_x]))
}

/** One public key (x) of this organisation by its key id, or null. */
export async function publicKeyById(orgId: string, kid: string): Promise<string | null> {
  const [row] = await useDb().query<{ public_x: string }>('SELECT public_x FROM org_signing_keys WHERE org_id = :orgId AND kid = :kid', { replacements: { orgId, kid }, type: QueryTypes.SELECT })
  return row?.public_x ?? null
}

export async function rotateSigningKey(event: H3Event, access: OrgAccess): Promise<SigningKeyDto[]> {
  await inTransaction(async (t) => {
    await useDb().query('SELECT pg_advisory_xact_lock(hashtext(:k))', { replacements: { k: `signing-key:${access.org.id}` }, transaction: t })
    const retired = await useDb().query<{ kid: string }>('UPDATE org_signing_keys SET status = \'retired\', retired_at = now() WHERE org_id = :orgId AND status = \'active\' RETURNING kid',
      { replacements: { orgId: access.org.id }, type: QueryTypes.SELECT, transaction: t })
    const created = await createKey(access.org.id, t)
    await audit(event, { orgId: access.org.id, action: 'signing-key.rotate', objectType: 'signing_key', objectId: created.kid, detail: { retired: retired.map(r => r.kid), created: created.kid } }, t)
  })
  return listSigningKeys(access.org.id)
}

/** An organisation's public signing keys by its slug (published without sign-in), or 404. */
export async function publicKeysOfSlug(slug: string): Promise<{ keys: SigningKeyDto[] }> {
  const org = await Organisation.findOne({ where: { slug } })
  if (!org) notFound('organisation')
  return { keys: await listSigningKeys(org.id) }
}
