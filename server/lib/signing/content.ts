import { createHash } from 'node:crypto'
import canonicalize from 'canonicalize'

// The object an export signs, in two formats. Every visible cell of the workbook is derived from it; verify rebuilds the
// cells from the signed object and compares them one by one.
// - knotwork-signed-table/1 (until issue 11): sheets "Filled values", "Given points", "Method and checks" (one row per
//   leaf of the object, with its path) and "Signature". Still verified exactly as written (workbook-model.ts, frozen).
// - knotwork-signed-table/2: the same object with fill.fittedOn (the points the fill was fitted on); the sheets read in
//   words and the table's unit (workbook-v2.ts), and the Signature sheet also carries the audit-trail head signed on
//   its own (anchor.ts).
export const SIGNED_FORMAT_V1 = 'knotwork-signed-table/1'
export const SIGNED_FORMAT = 'knotwork-signed-table/2'
/**
 * knotwork-signed-table/3 (issue 17): a two-way table. The table names its column axis and whether it has an ultimate
 * column; the given cells and the fill's values are [x, d, y] triples (d null: the ultimate column); the sheets read as
 * format 2's do, with a column for the second axis (readable-v3.ts). One-way tables keep format 2.
 */
export const SIGNED_FORMAT_V3 = 'knotwork-signed-table/3'

export type Json = string | number | boolean | null | Json[] | { [key: string]: Json }
export interface Person { name: string; email: string }
/** [x, y] as canonical decimal strings (shared/decimal-text.ts canonicalDecimal), sorted by x. */
export type Pair = [string, string]

export interface SignedFillV1 {
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

export interface SignedFill extends SignedFillV1 {
  /** The given points the fill was fitted on: the version's content hash then, and its lock version right after. */
  fittedOn: { contentHash: string | null; lockVersion: number | null }
}

interface ContentCommon {
  organisation: { slug: string; name: string }
  /** compounding: how a curve's rates compound (curve kinds only; signed since issue 16, absent from older exports) */
  table: { id: string; name: string; kind: string; axis: string; axisUnit: string; valueUnit: string; compounding?: string }
  version: { id: string; number: number; status: string; contentHash: string; notes: string }
  /** the given points, per unit */
  points: Pair[]
  madeBy: Person | null
  submittedBy: Person | null
  submittedAt: string | null
  approvedBy: Person | null
  approvedAt: string | null
  signedAt: string
  keyId: string
}
export interface SignedContentV1 extends ContentCommon { format: typeof SIGNED_FORMAT_V1; fill: SignedFillV1 | null }
export interface SignedContentV2 extends ContentCommon { format: typeof SIGNED_FORMAT; fill: SignedFill | null }
/** [x, d, y] of a two-way table, canonical decimal strings; d null is the ultimate column. Sorted by x, then d, ultimate last. */
export type Triple = [string, string | null, string]
export interface SignedFillV3 extends Omit<SignedFill, 'values'> { values: Triple[] }
export interface SignedContentV3 extends Omit<ContentCommon, 'points' | 'table'> {
  format: typeof SIGNED_FORMAT_V3
  table: ContentCommon['table'] & { shape: 'two-way'; colAxis: string; colAxisUnit: string; hasUltimate: boolean }
  /** the given cells, per unit */
  cells: Triple[]
  fill: SignedFillV3 | null
}
/** What new exports and the read API sign: format 2 for a one-way table, format 3 for a two-way one. */
export type SignedContent = SignedContentV2 | SignedContentV3
export type AnySignedContent = SignedContentV1 | SignedContentV2 | SignedContentV3

/** RFC 8785 (JSON Canonicalization Scheme) text of a JSON value, as UTF-8 bytes: what Ed25519 signs. */
export function canonicalBytes(value: object): Buffer {
  const text = canonicalize(value)
  if (text === undefined) throw new TypeError('the value cannot be canonicalised')
  return Buffer.from(text, 'utf8')
}

/** SHA-256 (FIPS 180-4) of the canonical bytes, lower-case hex. */
export function contentSha256(value: object): string {
  return createHash('sha256').update(canonicalBytes(value)).digest('hex')
}
