import { canonicalBytes } from './content'
import { signBytes, verifyBytes } from './keys'
import type { KeyObject } from 'node:crypto'

// The head of an organisation's audit trail, signed with its Ed25519 key on its own (not inside a version's content,
// which never changes, while the trail grows). Carried by every signed export and read-API answer, and stored as a
// checkpoint at least daily and on every sign-off: a trail that no longer reaches a signed head lost its newest events.
export const HEAD_FORMAT = 'knotwork-audit-head/1'
export type HeadReason = 'export' | 'read-api' | 'daily' | 'sign-off'

export interface ChainHead {
  /** the event's number in the organisation's trail (1, 2, 3, ... without gaps) */
  number: number
  /** the event's id in the database */
  eventId: string
  /** SHA-256 chain hash of the event (server/lib/audit-chain.ts) */
  hash: string
  at: string
}

export interface HeadStatement {
  format: typeof HEAD_FORMAT
  organisation: { slug: string; name: string }
  /** null: the trail was empty */
  head: ChainHead | null
  statedAt: string
  reason: HeadReason
  keyId: string
}

export interface SignedHead { statement: HeadStatement; signature: string }

export function signHead(statement: HeadStatement, privateKey: KeyObject): SignedHead {
  return { statement, signature: signBytes(canonicalBytes(statement), privateKey) }
}

/** The statement's Ed25519 signature holds under the public key x (and it is a head statement at all). */
export function headSignatureHolds(signed: SignedHead, x: string): boolean {
  return signed.statement?.format === HEAD_FORMAT && verifyBytes(canonicalBytes(signed.statement), signed.signature, x)
}
