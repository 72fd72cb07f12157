// Verifies a Knotwork signed workbook without the Knotwork server.
//   npx tsx scripts/verify-export.ts file.xlsx [jwks.json] [--out dir]
// jwks.json: the organisation's published keys (GET /api/keys/<organisation>.json); without it the
// public key written in the file is used, which proves integrity but not who signed (compare the key id
// with the published one). --out writes content.json, sig.bin and pub.pem for the openssl check in
// docs/verify-offline.md.
import { readFileSync, writeFileSync, mkdirSync } from 'node:fs'
import path from 'node:path'
import { fileURLToPath } from 'node:url'
import { LABEL, SIGNED_FORMAT_V1, storedSignedContent, canonicalBytes, contentFromSheets, contentSha256, publicPem, readWorkbookCells, signatureSheetField as field, verifyWorkbookCells, type SheetCells } from '../server/lib/signing'

/** The signed content as canonical bytes: rebuilt from the visible sheets (first format) or joined from its stored parts. */
function signedBytes(sheets: SheetCells): Buffer {
  if (field(sheets, LABEL.format) === SIGNED_FORMAT_V1) return canonicalBytes(contentFromSheets(sheets))
  const stored = storedSignedContent(sheets)
  if (!stored) throw new Error('the Signature sheet holds no readable signed content')
  return canonicalBytes(stored)
}

/** The files openssl needs: the canonical signed content, the raw signature, the public key. */
export async function extractForOpenssl(file: Buffer, x: string) {
  const sheets = await readWorkbookCells(file)
  const content = signedBytes(sheets)
  return { content, signature: Buffer.from(field(sheets, LABEL.signature) ?? '', 'base64'), pem: publicPem(x), sha256: contentSha256(JSON.parse(content.toString('utf8')) as object) }
}

async function main() {
  const args = process.argv.slice(2)
  const outAt = args.indexOf('--out')
  const out = outAt >= 0 ? args.splice(outAt, 2)[1] : undefined
  const [file, jwksFile] = args
  if (!file) { console.error('usage: npx tsx scripts/verify-export.ts file.xlsx [jwks.json] [--out dir]'); process.exit(2) }
  const data = readFileSync(file)
  const sheets = await readWorkbookCells(data)
  const published = jwksFile ? (JSON.parse(readFileSync(jwksFile, 'utf8')) as { keys: { kid: string; x: string; status?: string }[] }).keys : null
  const inFile = field(sheets, 'Public key (Ed25519 x, base64url)')
  const lookup = (kid: string) => (published ? published.find(k => k.kid === kid)?.x ?? null : inFile)
  const verdict = verifyWorkbookCells(sheets, lookup)
  if (verdict.kind === 'genuine') {
    const c = verdict.content
    console.log(`GENUINE: ${c.table.name}, version ${c.version.number} (${c.organisation.name}), signed off by ${c.approvedBy?.name ?? '?'} at ${c.approvedAt}, file signed ${c.signedAt}`)
    console.log(`key id ${verdict.keyId}${published ? ' (found in the published key set)' : ' (key taken from the file itself: compare this key id with the published one)'}`)
    const head = verdict.anchor?.statement.head
    if (verdict.anchor) console.log(head ? `audit trail when the file was made: event #${head.number} (id ${head.eventId}), hash ${head.hash}; check it on the audit trail page` : 'audit trail when the file was made: empty')
  } else if (verdict.kind === 'altered') {
    console.log(`ALTERED: ${verdict.reason}`)
    for (const d of verdict.differences) console.log(`  ${d.cell}: signed ${JSON.stringify(d.expected)}, found ${JSON.stringify(d.found)}`)
  } else if (verdict.kind === 'unknown-key') {
    console.log(`UNKNOWN KEY: ${verdict.keyId} is not in ${jwksFile}`)
  } else {
    console.log(`NOT SIGNED: ${verdict.reason}`)
  }
  const kid = field(sheets, LABEL.keyId)
  const x = kid ? lookup(kid) : null
  if (out && x) {
    mkdirSync(out, { recursive: true })
    const parts = await extractForOpenssl(data, x)
    writeFileSync(path.join(out, 'content.json'), parts.content)
    writeFileSync(path.join(out, 'sig.bin'), parts.signature)
    writeFileSync(path.join(out, 'pub.pem'), parts.pem)
    console.log(`wrote ${out}/content.json (SHA-256 ${parts.sha256}), ${out}/sig.bin, ${out}/pub.pem`)
  }
  process.exit(verdict.kind === 'genuine' ? 0 : 1)
}

if (process.argv[1] && fileURLToPath(import.meta.url) === path.resolve(process.argv[1])) {
  main().catch((e) => { console.error(e instanceof Error ? e.message : e); process.exit(2) })
}
