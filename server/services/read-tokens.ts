import { createHash, randomBytes } from 'node:crypto'
import type { H3Event } from 'h3'
import { QueryTypes } from 'sequelize'
import type { OrgAccess } from '../utils/auth'
import type { ReadTokenDto } from '#shared/types/read-tokens'

type Row = Record<string, unknown>
const PREFIX = 'kwr_'
const hashOf = (token: string) => createHash('sha256').update(token).digest('hex')
const toDto = (r: Row): ReadTokenDto => ({
  id: r.id as string,
  name: r.name as string,
  hint: r.hint as string,
  createdBy: (r.created_by_name as string | null) ?? null,
  createdAt: new Date(r.created_at as string).toISOString(),
  lastUsedAt: r.last_used_at ? new Date(r.last_used_at as string).toISOString() : null,
  revokedAt: r.revoked_at ? new Date(r.revoked_at as string).toISOString() : null,
  tables: (r.tables as { id: string, name: string }[] | null) ?? null,
})

export async function listReadTokens(orgId: string): Promise<ReadTokenDto[]> {
  const rows = await useDb().query<Row>(`SELECT t.*, u.name AS created_by_name,
      (SELECT json_agg(json_build_object('id', rt.id, 'name', rt.name) ORDER BY rt.name) FROM rate_tables rt WHERE rt.id = ANY(t.table_ids)) AS tables
    FROM read_tokens t LEFT JOIN users u ON u.id = t.created_by
    WHERE t.org_id = :orgId ORDER BY t.revoked_at IS NOT NULL, t.created_at DESC`, { replacements: { orgId }, type: QueryTypes.SELECT })
  return rows.map(toDto)
}

/**
 * A new token: 32 random bytes, base64url, with a prefix that says what it is. Returned once, stored as its SHA-256.
 * `tables` limits it to those tables (each must be this organisation's); without it, it reads every signed-off table.
 */
export async function createReadToken(event: H3Event, access: OrgAccess, name: string, tables?: string[]): Promise<{ token: string, readToken: ReadTokenDto }> {
  const token = `${PREFIX}${randomBytes(32).toString('base64url')}`
  const hint = `${token.slice(0, 8)}…${token.slice(-4)}`
  const id = await inTransaction(async (t) => {
    const ids = tables ? [...new Set(tables)] : null
    const named = ids
      ? await useDb().query<{ id: string, name: string }>('SELECT id, name FROM rate_tables WHERE org_id = :orgId AND id IN (:ids) ORDER BY name',
        { replacements: { orgId: access.org.id, ids }, type: QueryTypes.SELECT, transaction: t })
      : null
    if (ids && named!.length !== ids.length) throw apiError(400, 'invalid-input', 'A chosen table is not one of this organisation\'s tables.')
    const [row] = await useDb().query<{ id: string }>(`INSERT INTO read_tokens (org_id, name, token_hash, hint, created_by, table_ids)
      VALUES (:orgId, :name, :hash, :hint, :userId, ${ids ? 'ARRAY[:ids]::uuid[]' : 'NULL'}) RETURNING id`,
    { replacements: { orgId: access.org.id, name, hash: hashOf(token), hint, userId: access.user.id, ids }, type: QueryTypes.SELECT, transaction: t })
    await audit(event, { orgId: access.org.id, action: 'read-token.create', objectType: 'read_token', objectId: row!.id,
      detail: { name, hint, tables: named ? named.map(n => n.name) : 'every signed-off table' } }, t)
    return row!.id
  })
  const readToken = (await listReadTokens(access.org.id)).find(r => r.id === id)!
  return { token, readToken }
}

export async function revokeReadToken(event: H3Event, access: OrgAccess, id: string): Promise<void> {
  await inTransaction(async (t) => {
    const rows = await useDb().query<{ name: string }>(`UPDATE read_tokens SET revoked_at = now() WHERE id = :id AND org_id = :orgId AND revoked_at IS NULL RETURNING name`,
      { replacements: { id, orgId: access.org.id }, type: QueryTypes.SELECT, transaction: t })
    if (!rows.length) notFound('read token')
    await audit(event, { orgId: access.org.id, action: 'read-token.revoke', objectType: 'read_token', objectId: id, detail: { name: rows[0]!.name } }, t)
  })
}

export interface ReadAccess {
  tokenId: string
  tokenName: string
  org: { id: string, slug: string, name: string }
  /** The tables the token may read, or null for all of the organisation's. */
  tableIds: string[] | null
}

/** Requests per token per clock minute; more answer 429 until the minute ends. */
export const READ_REQUESTS_PER_MINUTE = 300

/**
 * Checks a token and counts this request in its clock minute, in one UPDATE (`hash`: the placeholder of the token's
 * SHA-256). A statement of its own for the list route; the first step of the table route's one statement (signed-bodies.ts).
 */
export const touchTokenSql = (hash: string) => `UPDATE read_tokens r SET last_used_at = now(),
    window_count = CASE WHEN r.window_start = date_trunc('minute', now()) THEN r.window_count + 1 ELSE 1 END,
    window_start = date_trunc('minute', now())
  FROM organisations o
  WHERE r.token_hash = ${hash} AND r.revoked_at IS NULL AND o.id = r.org_id
  RETURNING r.id, r.name, r.table_ids::text[] AS table_ids, r.window_count,
    ceil(extract(epoch FROM date_trunc('minute', now()) + interval '1 minute' - now()))::int AS window_left,
    o.id AS org_id, o.slug, o.name AS org_name`

/** The SHA-256 of the request's bearer token, or null when it carries none that could be one. */
export function bearerHash(event: H3Event): string | null {
  const token = /^Bearer\s+(\S+)$/i.exec(getRequestHeader(event, 'authorization') ?? '')?.[1] ?? ''
  return token.startsWith(PREFIX) ? hashOf(token) : null
}

/** The access a touched token row gives: 401 without one (missing, unknown and revoked alike), 429 past the minute's limit. */
export function tokenAccess(event: H3Event, row: Row | undefined): ReadAccess {
  if (!row) {
    setResponseHeader(event, 'www-authenticate', 'Bearer realm="knotwork"')
    throw apiError(401, 'read-token-required', 'A valid read token is needed: send "Authorization: Bearer <token>". An administrator creates tokens on the members page.')
  }
  if ((row.window_count as number) > READ_REQUESTS_PER_MINUTE) {
    const wait = Math.max(1, row.window_left as number)
    setResponseHeader(event, 'retry-after', wait)
    throw apiError(429, 'rate-limited', `This token has made more than ${READ_REQUESTS_PER_MINUTE} requests this minute; retry in ${wait} s (a 304 answer counts too).`)
  }
  return { tokenId: row.id as string, tokenName: row.name as string, org: { id: row.org_id as string, slug: row.slug as string, name: row.org_name as string },
    tableIds: (row.table_ids as string[] | null) ?? null }
}

/**
 * The organisation a bearer token reads, or 401 (missing, unknown and revoked tokens answer alike). Each request is
 * counted against the token's minute in the same UPDATE; beyond READ_REQUESTS_PER_MINUTE it answers 429 with
 * Retry-After.
 */
export async function requireReadToken(event: H3Event): Promise<ReadAccess> {
  const hash = bearerHash(event)
  const [row] = hash ? await useDb().query<Row>(touchTokenSql(':hash'), { replacements: { hash }, type: QueryTypes.SELECT }) : []
  return tokenAccess(event, row)
}
