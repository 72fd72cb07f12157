import { formatUtc } from '#shared/plain-text'
import { HEAD_FORMAT, type SignedHead } from './anchor'
import { canonicalBytes, type SignedContentV2, type SignedContentV3 } from './content'
import { readableSheetsV3 } from './readable-v3'
import { SHEET_V2, escaped, readableSheets } from './readable'
import type { CellValue, SheetModel, SignatureBlock } from './workbook-model'

// The cells of a signed workbook of format 2 (knotwork-signed-table/2): the readable sheets (readable.ts) and a Signature
// sheet with the signed content (canonical JSON, in parts) and, signed on its own, the head of the organisation's audit
// trail when the file was made. Writing uses this model; verifying rebuilds it from the signed objects and compares
// every cell.
export const CONTENT_CHUNK = 30_000 // characters per cell (Excel allows 32,767)
export const LABEL = {
  keyId: 'Key id', signature: 'Signature (base64)', parts: 'Signed content, part ', format: 'Format',
  headParts: 'Audit trail head statement, part ', headSignature: 'Audit trail head signature (base64)',
} as const

const chunks = (text: string) => {
  const parts: string[] = []
  for (let i = 0; i < text.length; i += CONTENT_CHUNK) parts.push(text.slice(i, i + CONTENT_CHUNK))
  return parts
}

function headRows(anchor: SignedHead | null): CellValue[][] {
  if (!anchor) return []
  const s = anchor.statement
  const head = s.head
  return [
    [],
    ['The audit trail when this file was made', null],
    ['Latest event', head ? `number ${head.number} in ${s.organisation.name}'s trail (event id ${head.eventId}), recorded ${formatUtc(head.at)}` : 'the trail was empty'],
    ['Latest event hash', head?.hash ?? '—'],
    ['Why this is here', `Removing the newest events of a trail leaves a shorter chain that still links up. Keep this file: Knotwork's audit trail page checks the trail against this number and hash ("Check against an event you hold"), and says which events are missing if they were removed.`],
    ['Head statement format', HEAD_FORMAT],
    ...chunks(canonicalBytes(s).toString('utf8')).map((p, i): CellValue[] => [`${LABEL.headParts}${i + 1}`, p]),
    [LABEL.headSignature, anchor.signature],
  ]
}

/** The Signature sheet of formats 2 and 3 (the format row names the content's own format). */
export function signatureRowsV2(content: SignedContentV2 | SignedContentV3, block: SignatureBlock, canonical: string, anchor: SignedHead | null): CellValue[][] {
  const slug = content.organisation.slug
  const parts = chunks(canonical)
  return [
    ['Signature of this workbook', null],
    [LABEL.format, content.format],
    ['Algorithm', 'Ed25519 (RFC 8032), pure EdDSA over the canonical bytes (no pre-hash)'],
    ['Canonicalisation', 'RFC 8785 JSON Canonicalization Scheme, UTF-8, of the content object stored below in parts. The other sheets are derived from it; a check rebuilds them and compares every cell.'],
    ['Content SHA-256', block.sha256],
    [LABEL.keyId, block.keyId],
    ['Public key (Ed25519 x, base64url)', block.x],
    ['Published keys', `GET /api/keys/${slug}.json on the Knotwork server (JWK set, current and retired keys)`],
    [LABEL.signature, block.signature],
    ['How to verify', 'In Knotwork: "Check a file". Offline: npx tsx scripts/verify-export.ts file.xlsx [jwks.json], or with openssl as in docs/verify-offline.md.'],
    ['Signed content parts', parts.length],
    ...parts.map((p, i): CellValue[] => [`${LABEL.parts}${i + 1}`, p]),
    ...headRows(anchor),
  ]
}

/** Every sheet and cell of a signed workbook of format 2 (a one-way table) or 3 (a two-way table: readable-v3.ts). */
export function workbookModelV2(content: SignedContentV2 | SignedContentV3, block: SignatureBlock, canonical: string, anchor: SignedHead | null): SheetModel[] {
  const state = content.version.status === 'retired' ? ' It has since been withdrawn or superseded: it was no longer in force when this file was made.' : ''
  const banner = [`Signed off by ${content.approvedBy?.name ?? '—'} on ${formatUtc(content.approvedAt)}; this file was signed on ${formatUtc(content.signedAt)}.${state} The Signature sheet says how to check it.`]
  const extra = [{ label: 'File signed at', value: formatUtc(content.signedAt) }, { label: 'Signing key id', value: content.keyId }]
  return [
    ...(content.format === 'knotwork-signed-table/3' ? readableSheetsV3(content, banner, extra) : readableSheets(content, banner, extra)),
    ...escaped([{ name: SHEET_V2.signature, rows: signatureRowsV2(content, block, canonical, anchor), widths: [40, 110] }]),
  ]
}
