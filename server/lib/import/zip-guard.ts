import yauzl from 'yauzl'
import type { Entry, ZipFile } from 'yauzl'
import { IMPORT_LIMITS, ImportRefused } from './limits'

const L = IMPORT_LIMITS
const damaged = () => new ImportRefused(400, 'The file is not a complete .xlsx workbook (the zip is damaged or cut short). Save it again from your spreadsheet program and retry.')

function open(buf: Buffer): Promise<ZipFile> {
  return new Promise((resolve, reject) => yauzl.fromBuffer(buf, { lazyEntries: true, validateEntrySizes: true, autoClose: false },
    (err, zip) => (err || !zip ? reject(damaged()) : resolve(zip))))
}

/** Reads the central directory only: nothing is inflated here. */
function listEntries(zip: ZipFile): Promise<Entry[]> {
  return new Promise((resolve, reject) => {
    const entries: Entry[] = []
    zip.on('entry', (entry: Entry) => {
      entries.push(entry)
      if (entries.length > L.zipEntries) { zip.close(); reject(new ImportRefused(422, `The workbook has more than ${L.zipEntries} parts; Knotwork refuses it.`)); return }
      zip.readEntry()
    })
    zip.on('end', () => resolve(entries))
    zip.on('error', () => reject(damaged()))
    zip.readEntry()
  })
}

function checkDeclared(entries: Entry[]): number {
  let total = 0
  for (const e of entries) {
    if (e.isEncrypted()) throw new ImportRefused(422, 'The workbook is encrypted. Remove the password in your spreadsheet program and retry.')
    if (e.uncompressedSize > L.entryBytes) throw new ImportRefused(413, `A part of the workbook (${e.fileName}) would inflate to more than ${L.entryBytes / 1048576} MiB; Knotwork refuses it.`)
    total += e.uncompressedSize
    const ratio = e.uncompressedSize / Math.max(1, e.compressedSize)
    if (e.uncompressedSize > 1048576 && ratio > L.compressionRatio) {
      throw new ImportRefused(422, `A part of the workbook (${e.fileName}) is compressed ${Math.round(ratio)}:1, far beyond any real spreadsheet; refused as a possible zip bomb.`)
    }
  }
  if (total > L.totalInflatedBytes) throw new ImportRefused(413, `The workbook would inflate to more than ${L.totalInflatedBytes / 1048576} MiB; Knotwork refuses it.`)
  return total
}

const DOCTYPE = Buffer.from('<!doctype')
const ENTITY = Buffer.from('<!entity')
const ROW_OPEN = [Buffer.from('<row '), Buffer.from('<row>')]

function countOf(hay: Buffer, needle: Buffer, from: number): number {
  let n = 0
  for (let i = hay.indexOf(needle, from); i !== -1; i = hay.indexOf(needle, i + needle.length)) n++
  return n
}

/** Inflates one XML part with a running byte count; refuses DTDs and counts sheet rows. */
function scanEntry(zip: ZipFile, entry: Entry): Promise<void> {
  const isSheet = /^xl\/worksheets\/[^/]+\.xml$/i.test(entry.fileName)
  return new Promise((resolve, reject) => {
    zip.openReadStream(entry, (err, stream) => {
      if (err || !stream) { reject(damaged()); return }
      let seen = 0
      let rows = 0
      let carry = Buffer.alloc(0)
      let first = true
      const fail = (e: Error) => { stream.destroy(); reject(e) }
      stream.on('data', (chunk: Buffer) => {
        seen += chunk.length
        if (seen > entry.uncompressedSize || seen > L.entryBytes) return fail(new ImportRefused(422, `A part of the workbook (${entry.fileName}) inflates to more than it declares; refused.`))
        if (first && chunk.length >= 2 && ((chunk[0] === 0xff && chunk[1] === 0xfe) || (chunk[0] === 0xfe && chunk[1] === 0xff))) {
          return fail(new ImportRefused(422, 'The workbook has XML parts in UTF-16; save it again as a standard .xlsx.'))
        }
        first = false
        const lower = Buffer.from(Buffer.concat([carry, chunk]).toString('latin1').toLowerCase(), 'latin1')
        if (lower.includes(DOCTYPE) || lower.includes(ENTITY)) {
          return fail(new ImportRefused(422, `The workbook contains an XML document type declaration (in ${entry.fileName}); Knotwork refuses such files.`))
        }
        if (isSheet) {
          for (const needle of ROW_OPEN) rows += countOf(lower, needle, carry.length > 0 ? Math.max(0, carry.length - needle.length + 1) : 0)
          if (rows > L.rows + 1) return fail(new ImportRefused(413, `A sheet has more than ${L.rows.toLocaleString('en-GB')} rows; split the file or remove unused rows.`))
        }
        carry = lower.subarray(Math.max(0, lower.length - 16))
      })
      stream.on('error', (e: Error) => reject(/too many bytes|expected \d+/i.test(e.message)
        ? new ImportRefused(422, `A part of the workbook (${entry.fileName}) inflates to more than it declares; refused.`)
        : damaged()))
      stream.on('end', () => resolve())
    })
  })
}

/**
 * Checks an .xlsx zip before any XML parser sees it: central directory first (entry count,
 * declared sizes, compression ratio, encryption), then each XML part inflated with a running
 * counter (actual size never above the declared size), DOCTYPE/ENTITY refused, sheet rows capped.
 */
export async function guardXlsxZip(buf: Buffer): Promise<{ inflatedBytes: number }> {
  const zip = await open(buf)
  try {
    const entries = await listEntries(zip)
    const inflatedBytes = checkDeclared(entries)
    if (!entries.some(e => e.fileName === 'xl/workbook.xml')) {
      throw new ImportRefused(415, 'The zip is not an Excel workbook (.xlsx): it has no workbook part.')
    }
    for (const entry of entries) {
      if (/\.(xml|rels|vml)$/i.test(entry.fileName)) await scanEntry(zip, entry)
    }
    return { inflatedBytes }
  } finally {
    zip.close()
  }
}
