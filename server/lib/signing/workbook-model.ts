import { SIGNED_FORMAT_V1, type Json, type Pair, type SignedContentV1 as SignedContent } from './content'
import { escapeText } from './escape'
import { toRows, type JsonRow } from './json-rows'

// The cells of a signed workbook of the first format (knotwork-signed-table/1), derived from the signed content alone
// (plus the signature block). FROZEN: files of this format are held by auditors and verify against exactly these cells
// (tests/unit/export/old-exports.test.ts). New exports use workbook-v2.ts; change nothing here.
export type CellValue = string | number | boolean | null
export interface SheetModel { name: string; rows: CellValue[][]; widths: number[] }
export interface SignatureBlock { signature: string; keyId: string; x: string; sha256: string }

export const SHEET = { filled: 'Filled values', given: 'Given points', about: 'Method and checks', signature: 'Signature' } as const
export const CAUTION = 'Caution: filled tables drive reserves and prices. They need review by a qualified actuary under the applicable actuarial standards and local regulation before use.'
export const PAIR_HEADER = ['x', 'Value (per unit)', 'x, exact decimal', 'Value, exact decimal']
export const ABOUT_HEADER = ['Item', 'Value', 'Content path', 'Type']
export const ABOUT_FIRST_DATA_ROW = 4 // 0-based: title, caution, blank, header
export const CONTENT_CHUNK = 30_000 // characters per cell (Excel allows 32,767)

/** The top-level fields shown in "Method and checks", in this order (points and fill values have their own sheets). */
export const ABOUT_FIELDS = ['format', 'organisation', 'table', 'version', 'madeBy', 'fill', 'submittedBy', 'submittedAt', 'approvedBy', 'approvedAt', 'signedAt', 'keyId'] as const

const LABELS: Record<string, string> = {
  '/format': 'File format', '/organisation/name': 'Organisation', '/table/name': 'Table', '/table/kind': 'Kind of table',
  '/version/number': 'Version', '/version/status': 'Version state when signed', '/madeBy/name': 'Made by',
  '/fill/spec/method': 'Method', '/fill/spec/transform': 'Transform', '/fill/spec/precision': 'Precision (significant digits)',
  '/fill/spec/extrapolation': 'Outside the given points', '/fill/rationale': 'Reasons for the choice', '/fill/filledBy/name': 'Filled by',
  '/fill/checks/knotsReproduced': 'Passes through every given point', '/fill/checks/maxKnotDeviation': 'Largest deviation at a given point',
  '/submittedBy/name': 'Submitted by', '/approvedBy/name': 'Signed off by', '/approvedAt': 'Signed off at', '/signedAt': 'File signed at', '/keyId': 'Signing key id',
}
const words = (s: string) => s.replace(/~1/g, '/').replace(/~2/g, '[').replace(/~0/g, '~').replace(/([a-z])([A-Z])/g, '$1 $2').toLowerCase()
/** A readable label for a content path (a fixed function of the path). */
export function labelOf(path: string): string {
  return LABELS[path] ?? path.split('/').filter(Boolean).map(words).join(' › ')
}

const pairRows = (pairs: Pair[]): CellValue[][] => [PAIR_HEADER, ...pairs.map(([x, y]) => [Number(x), Number(y), x, y])]

/** The content without points and fill values, as rows of "Method and checks". */
export function aboutRows(content: SignedContent): JsonRow[] {
  const record = content as unknown as Record<string, Json>
  const rows: JsonRow[] = []
  for (const field of ABOUT_FIELDS) {
    let value = record[field] ?? null
    if (field === 'fill' && content.fill) {
      const { values: _values, ...rest } = content.fill
      value = rest as unknown as Json
    }
    toRows(value, `/${field}`, rows)
  }
  return rows
}

export function signatureRows(content: SignedContent, block: SignatureBlock, canonical: string): CellValue[][] {
  const parts: string[] = []
  for (let i = 0; i < canonical.length; i += CONTENT_CHUNK) parts.push(canonical.slice(i, i + CONTENT_CHUNK))
  const slug = content.organisation.slug
  return [
    ['Signature of this workbook', null],
    ['Format', SIGNED_FORMAT_V1],
    ['Algorithm', 'Ed25519 (RFC 8032), pure EdDSA over the canonical bytes (no pre-hash)'],
    ['Canonicalisation', `RFC 8785 JSON Canonicalization Scheme, UTF-8, of the content object. It is rebuilt from the sheets "${SHEET.filled}", "${SHEET.given}" and "${SHEET.about}" (exact decimal and content-path columns), and a copy is stored below.`],
    ['Content SHA-256', block.sha256],
    ['Key id', block.keyId],
    ['Public key (Ed25519 x, base64url)', block.x],
    ['Published keys', `GET /api/keys/${slug}.json on the Knotwork server (JWK set, current and retired keys)`],
    ['Signature (base64)', block.signature],
    ['How to verify', 'In Knotwork: "Check a signed file". Offline: npx tsx scripts/verify-export.ts file.xlsx [jwks.json], or with openssl as in docs/verify-offline.md.'],
    ['Signed content parts', parts.length],
    ...parts.map((p, i): CellValue[] => [`Signed content, part ${i + 1}`, p]),
  ]
}

/** Every sheet and cell of the signed workbook, with text cells already escaped against formula injection. */
export function workbookModel(content: SignedContent, block: SignatureBlock, canonical: string): SheetModel[] {
  const about: CellValue[][] = [
    [`${content.table.name}, version ${content.version.number} (${content.organisation.name})`],
    [CAUTION],
    [],
    ABOUT_HEADER,
    ...aboutRows(content).map(r => [labelOf(r.path), r.value, r.path, r.type]),
  ]
  const sheets: SheetModel[] = [
    { name: SHEET.filled, rows: pairRows(content.fill?.values ?? []), widths: [14, 22, 22, 48] },
    { name: SHEET.given, rows: pairRows(content.points), widths: [14, 22, 22, 48] },
    { name: SHEET.about, rows: about, widths: [40, 48, 44, 12] },
    { name: SHEET.signature, rows: signatureRows(content, block, canonical), widths: [34, 100] },
  ]
  return sheets.map(s => ({ ...s, rows: s.rows.map(row => row.map(v => (typeof v === 'string' ? (v === '' ? null : escapeText(v)) : v))) }))
}
