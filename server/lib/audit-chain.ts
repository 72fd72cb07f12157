import { createHash } from 'node:crypto'
import { canonicalJson } from './canonical-json'

// The content an audit event's hash covers (besides the previous hash of its chain).
export interface AuditContent {
  orgId: string | null
  actorId: string | null
  actorEmail: string | null
  action: string
  objectType: string | null
  objectId: string | null
  outcome: string
  requestId: string | null
  ip: string | null
  detail: Record<string, unknown>
  at: string // ISO-8601, millisecond precision
}

export const GENESIS = 'genesis'

/** hash_n = SHA-256(hash_{n-1} + "\n" + RFC 8785 JSON of event n). */
export function chainHash(prevHash: string | null, content: AuditContent): string {
  return createHash('sha256').update(`${prevHash ?? GENESIS}\n${canonicalJson(content)}`).digest('hex')
}

export interface ChainRow extends AuditContent { id: string; prevHash: string | null; hash: string }

/** The fields of a row the hash covers, and nothing else (a row may carry more, such as its number). */
export function hashedContent(row: AuditContent): AuditContent {
  const { orgId, actorId, actorEmail, action, objectType, objectId, outcome, requestId, ip, detail, at } = row
  return { orgId, actorId, actorEmail, action, objectType, objectId, outcome, requestId, ip, detail, at }
}

/** Walks one chain in order; returns the id of the first event whose link is broken, or null. */
export function firstBrokenLink(rows: ChainRow[]): { id: string; reason: string } | null {
  let prev: string | null = null
  for (const row of rows) {
    if (row.prevHash !== prev) return { id: row.id, reason: 'its link to the previous event does not match' }
    if (chainHash(prev, hashedContent(row)) !== row.hash) return { id: row.id, reason: 'its content does not match its hash' }
    prev = row.hash
  }
  return null
}
