import { SIGNED_FORMAT, SIGNED_FORMAT_V1, SIGNED_FORMAT_V3, canonicalBytes, contentSha256, type AnySignedContent, type SignedContentV1, type SignedContentV2, type SignedContentV3 } from './content'
import { headSignatureHolds, type SignedHead } from './anchor'
import { unescapeText } from './escape'
import { verifyBytes } from './keys'
import { SHEET, workbookModel, type CellValue, type SheetModel } from './workbook-model'
import { LABEL, workbookModelV2 } from './workbook-v2'
import { contentFromSheets, type SheetCells } from './workbook-io'

export interface CellDifference { cell: string; expected: CellValue; found: CellValue }
export type Verdict =
  | { kind: 'not-signed'; reason: string }
  | { kind: 'unknown-key'; keyId: string }
  /** anchor: the audit-trail head the file carries (format 2), its own signature checked */
  | { kind: 'genuine'; keyId: string; content: AnySignedContent; anchor: SignedHead | null }
  /** content: what was signed, when the signature still matches a content (then differences name the cells) */
  | { kind: 'altered'; keyId: string; reason: string; content: AnySignedContent | null; differences: CellDifference[]; differenceCount: number }

export const MAX_DIFFERENCES = 200

/** "A1"-style column letters (1-based column). */
export function columnName(n: number): string {
  let s = ''
  for (let c = n; c > 0; c = Math.floor((c - 1) / 26)) s = String.fromCharCode(65 + ((c - 1) % 26)) + s
  return s
}
const quoteSheet = (name: string) => name
/** A cell named the way people read it: Filled values!B17 (sheet name, '!', column letters, 1-based row). */
export function cellAddress(sheet: string, row0: number, col0: number): string {
  return `${quoteSheet(sheet)}!${columnName(col0 + 1)}${row0 + 1}`
}

/** Every cell where the upload differs from the workbook the signed content produces (sheets compared by name). */
export function diffCells(expected: SheetCells, actual: SheetCells): CellDifference[] {
  const out: CellDifference[] = []
  for (const name of new Set([...expected.keys(), ...actual.keys()])) {
    const e = expected.get(name)
    const a = actual.get(name)
    if (!e || !a) { out.push({ cell: quoteSheet(name), expected: e ? 'this sheet' : 'no such sheet', found: a ? 'an extra sheet' : 'the sheet is missing' }); continue }
    for (let r = 0; r < Math.max(e.length, a.length); r++) {
      const er = e[r] ?? []
      const ar = a[r] ?? []
      for (let c = 0; c < Math.max(er.length, ar.length); c++) {
        const ev = er[c] ?? null
        const av = ar[c] ?? null
        if (ev !== av) out.push({ cell: cellAddress(name, r, c), expected: ev, found: av })
      }
    }
  }
  return out
}

function signatureField(rows: CellValue[][], label: string): string | null {
  const row = rows.find(r => typeof r[0] === 'string' && unescapeText(r[0]) === label)
  const v = row?.[1]
  return typeof v === 'string' ? unescapeText(v) : typeof v === 'number' ? String(v) : null
}

/**
 * A field of the signature sheet ("Key id", "Public key (Ed25519 x, base64url)", ...) as it was written, with the
 * formula-guard apostrophe removed: a base64url key id can start with "-" and is then stored as "'-...".
 */
export function signatureSheetField(sheets: SheetCells, label: string): string | null {
  const sig = sheets.get(SHEET.signature)
  return sig ? signatureField(sig, label) : null
}

/** Joins the cells "<prefix>1", "<prefix>2", ... of the signature sheet; null when there are none. */
function joinedParts(rows: CellValue[][], prefix: string): string | null {
  const parts = rows.filter(r => typeof r[0] === 'string' && unescapeText(r[0]).startsWith(prefix)).map(r => (typeof r[1] === 'string' ? unescapeText(r[1]) : ''))
  return parts.length ? parts.join('') : null
}
function parsed<T>(text: string | null): T | null {
  try { return text === null ? null : JSON.parse(text) as T } catch { return null }
}

/** The signed content as stored on the Signature sheet (both formats keep a copy), or null when it cannot be read. */
export function storedSignedContent(sheets: SheetCells): AnySignedContent | null {
  const sig = sheets.get(SHEET.signature)
  return sig ? parsed<AnySignedContent>(joinedParts(sig, LABEL.parts)) : null
}

/**
 * Verifies a signed workbook's cells against the public key its key id names (lookup returns the key's x, or null when
 * the key is unknown). Genuine means: the signature holds over the content, the audit-trail head (format 2) holds under its
 * own signature, and every cell of every sheet is exactly the cell those signed objects produce. Files of the first
 * format are checked exactly as they were written (their content can also be rebuilt from the visible sheets).
 */
export function verifyWorkbookCells(sheets: SheetCells, lookup: (keyId: string) => string | null): Verdict {
  const sig = sheets.get(SHEET.signature)
  if (!sig) return { kind: 'not-signed', reason: `The workbook has no "${SHEET.signature}" sheet: it is not a Knotwork signed export.` }
  const keyId = signatureField(sig, LABEL.keyId)
  const signature = signatureField(sig, LABEL.signature)
  if (!keyId || !signature) return { kind: 'not-signed', reason: 'The signature sheet has no key id or no signature.' }
  const x = lookup(keyId)
  if (!x) return { kind: 'unknown-key', keyId }
  const holds = (c: AnySignedContent | null) => !!c && verifyBytes(canonicalBytes(c), signature, x)
  const altered = (reason: string) => ({ kind: 'altered' as const, keyId, reason, content: null, differences: [], differenceCount: 0 })
  const stored = parsed<AnySignedContent>(joinedParts(sig, LABEL.parts))
  const format = signatureField(sig, LABEL.format)
  let signed: AnySignedContent | null
  let anchor: SignedHead | null = null
  let model: SheetModel[]
  const block = (c: AnySignedContent) => ({ signature, keyId, x, sha256: contentSha256(c) })
  if (format === SIGNED_FORMAT_V1 || stored?.format === SIGNED_FORMAT_V1) {
    let rebuilt: SignedContentV1 | null = null
    try { rebuilt = contentFromSheets(sheets) } catch { rebuilt = null }
    signed = holds(stored) ? stored : holds(rebuilt) ? rebuilt : null
    if (!signed || signed.format !== SIGNED_FORMAT_V1) return altered('The signature does not match the content in the file: the signature, the stored content or the sheets were changed.')
    model = workbookModel(signed, block(signed), canonicalBytes(signed).toString('utf8'))
  } else {
    // format 2 (one-way) and 3 (two-way) share the Signature sheet; the stored content says which sheets it makes
    signed = holds(stored) && (stored?.format === SIGNED_FORMAT || stored?.format === SIGNED_FORMAT_V3) ? stored : null
    if (!signed) return altered('The signature does not match the signed content stored on the Signature sheet: the signature or the stored content was changed.')
    const headText = joinedParts(sig, LABEL.headParts)
    if (headText !== null) {
      anchor = { statement: parsed(headText)!, signature: signatureField(sig, LABEL.headSignature) ?? '' }
      const hx = anchor.statement ? lookup(anchor.statement.keyId) : null
      if (!hx || !headSignatureHolds(anchor, hx)) return altered('The audit-trail head on the Signature sheet does not carry a valid signature: it was changed.')
    }
    model = workbookModelV2(signed as SignedContentV2 | SignedContentV3, block(signed), canonicalBytes(signed).toString('utf8'), anchor)
  }
  const differences = diffCells(new Map(model.map(s => [s.name, s.rows])), sheets)
  if (!differences.length) return { kind: 'genuine', keyId, content: signed, anchor }
  return { kind: 'altered', keyId, reason: `${differences.length} cell(s) differ from the signed content.`, content: signed, differences: differences.slice(0, MAX_DIFFERENCES), differenceCount: differences.length }
}
