import { createHash, createPrivateKey } from 'node:crypto'
import { canonicalBytes, contentSha256, readWorkbookCells, signBytes, signatureSheetField, verifyWorkbookCells, writeSignedWorkbook, type SignedContent, type SignedHead, type Verdict } from '../../signing'
import { guardXlsxZip } from '../../import/zip-guard'
import { ImportRefused } from '../../import/limits'

// Signing and reading signed workbooks, run in a worker thread. The private key travels as PKCS #8 DER bytes.
const keyOf = (pkcs8: Uint8Array) => createPrivateKey({ key: Buffer.from(pkcs8), format: 'der', type: 'pkcs8' })

export interface ExportInput { content: SignedContent, pkcs8: Uint8Array, x: string, anchor: SignedHead | null }

/** The signed workbook of a content object: Ed25519 over its RFC 8785 bytes, every cell derived from it, with the trail's signed head. */
export async function buildExportTask(input: ExportInput): Promise<{ data: Uint8Array, signature: string }> {
  const signature = signBytes(canonicalBytes(input.content), keyOf(input.pkcs8))
  const data = await writeSignedWorkbook(input.content, { signature, keyId: input.content.keyId, x: input.x }, input.anchor)
  return { data, signature }
}

/**
 * The read API's answer for a version, produced once and stored: {"content", "signature", "keyId"} as JSON text.
 * `tag` is the SHA-256 of the content without its signing time (the weak ETag).
 */
export function signBodyTask(input: { content: SignedContent, pkcs8: Uint8Array }): { body: string, tag: string, sha256: string } {
  const { content } = input
  const signature = signBytes(canonicalBytes(content), keyOf(input.pkcs8))
  const body = JSON.stringify({ content, signature, keyId: content.keyId })
  return { body, tag: `W/"${contentSha256({ ...content, signedAt: '' })}"`, sha256: createHash('sha256').update(body).digest('hex') }
}

/**
 * Checks an uploaded workbook against the organisation's public keys (key id to x): the zip guard, every cell, the
 * signature. A file that is not a workbook or cannot be read is refused (415 / 422).
 */
export async function verifyExportTask(input: { data: Uint8Array, keys: Record<string, string> }): Promise<Verdict & { keyIdInFile: string | null }> {
  const data = Buffer.from(input.data.buffer, input.data.byteOffset, input.data.byteLength)
  if (!(data[0] === 0x50 && data[1] === 0x4b)) throw new ImportRefused(415, 'Upload the .xlsx workbook exactly as Knotwork exported it (this file is not an .xlsx workbook).')
  await guardXlsxZip(data)
  let sheets
  try { sheets = await readWorkbookCells(data) } catch (error) { throw new ImportRefused(422, `The workbook cannot be read: ${(error as Error).message}.`) }
  const verdict = verifyWorkbookCells(sheets, kid => input.keys[kid] ?? null)
  return { ...verdict, keyIdInFile: signatureSheetField(sheets, 'Key id') }
}
