import { createHash } from 'node:crypto'
import canonicalize from 'canonicalize'

// The object an export signs. Every visible data cell of the workbook is derived from it
// (workbook-model.ts), and it can be rebuilt from those cells (workbook-read.ts).
export const SIGNED_FORMAT = 'knotwork-signed-table/1'

export type Json = string | number | boolean | null | Json[] | { [key: string]: Json }
export interface Person { name: string; email: string }
/** [x, y] as canonical decimal strings (shared/decimal-text.ts canonicalDecimal), sorted by x. */
export type Pair = [string, string]

export interface SignedFill {
  /** the engine's fully resolved spec: method, options, transform, grid, precision, ... */
  spec: Json
  rationale: string
  /** the engine's checks of the fill (knots reproduced, curvature, monotonicity, range, forwards) */
  checks: Json
  /** the money view stored with the fill (fill_money) */
  money: Json
  filledBy: Person | null
  filledAt: string | null
  values: Pair[]
}

export interface SignedContent {
  format: typeof SIGNED_FORMAT
  organisation: { slug: string; name: string }
  table: { id: string; name: string; kind: string; axis: string; axisUnit: string; valueUnit: string }
  version: { id: string; number: number; status: string; contentHash: string; notes: string }
  /** the given points, per unit */
  points: Pair[]
  fill: SignedFill | null
  madeBy: Person | null
  submittedBy: Person | null
  submittedAt: string | null
  approvedBy: Person | null
  approvedAt: string | null
  signedAt: string
  keyId: string
}

/** RFC 8785 (JSON Canonicalization Scheme) text of the content, as UTF-8 bytes: what Ed25519 signs. */
export function canonicalBytes(content: SignedContent): Buffer {
  const text = canonicalize(content)
  if (text === undefined) throw new TypeError('the content cannot be canonicalised')
  return Buffer.from(text, 'utf8')
}

/** SHA-256 (FIPS 180-4) of the canonical bytes, lower-case hex. */
export function contentSha256(content: SignedContent): string {
  return createHash('sha256').update(canonicalBytes(content)).digest('hex')
}
