import { parse } from 'csv-parse'
import { IMPORT_LIMITS, ImportRefused } from './limits'
import { trimRow, type StoredSheet } from './stored-sheet'
import { yieldToEventLoop } from '../event-loop'

const L = IMPORT_LIMITS
/** text handed to the parser at a time; the server answers other requests between pieces */
const PIECE = 64 * 1024

function decodeText(buf: Buffer): string {
  try {
    return new TextDecoder('utf-8', { fatal: true }).decode(buf).replace(/^\uFEFF/, '')
  } catch {
    return new TextDecoder('windows-1252').decode(buf)
  }
}

const tooManyCells = (rows: number, cols: number, cap: number) => new ImportRefused(413,
  `The file has at least ${rows.toLocaleString('en-GB')} rows × ${cols} columns = ${(rows * cols).toLocaleString('en-GB')} cells; an upload may have at most ${cap.toLocaleString('en-GB')}. Remove unused rows or columns, or split the file.`)

/** A CSV upload as one sheet: delimiter guessed from the first lines, parsed piece by piece, rows, columns and cells capped. */
export async function readCsv(fileName: string, buf: Buffer, cellsCap: number = L.cells): Promise<StoredSheet[]> {
  let lines = 0
  for (let i = buf.indexOf(10); i !== -1; i = buf.indexOf(10, i + 1)) {
    if (++lines > L.rows + 1) throw new ImportRefused(413, `The file has more than ${L.rows.toLocaleString('en-GB')} rows; split the file or remove unused rows.`)
  }
  const text = decodeText(buf)
  const sample = text.split(/\r?\n/, 20).join('\n')
  const delimiter = ([',', ';', '\t'] as const).map(d => [d, sample.split(d).length] as const).sort((a, b) => b[1] - a[1])[0]![0]
  const rows: (string | null)[][] = []
  let colCount = 0
  let refused: ImportRefused | null = null
  const parser = parse({ delimiter, relax_column_count: true, relax_quotes: true, skip_empty_lines: false, bom: true })
  parser.on('readable', () => {
    for (let record: string[] | null; (record = parser.read() as string[] | null) !== null;) {
      const row = trimRow(record.map(v => (v.trim() === '' ? null : v)))
      rows.push(row)
      colCount = Math.max(colCount, row.length)
      if (colCount > L.columns) refused ??= new ImportRefused(413, `The file uses more than ${L.columns} columns; remove unused columns.`)
      else if (rows.length * colCount > cellsCap) refused ??= tooManyCells(rows.length, colCount, cellsCap)
    }
  })
  let failed = false
  parser.on('error', () => { failed = true }) // unbalanced quotes and the like; 'close' follows
  const ended = new Promise<void>(resolve => parser.once('end', resolve).once('close', resolve))
  for (let at = 0; at < text.length && !refused && !failed; at += PIECE) {
    parser.write(text.slice(at, at + PIECE))
    await yieldToEventLoop()
  }
  if (!refused && !failed) {
    parser.end()
    await ended
  }
  if (failed) throw new ImportRefused(400, 'The CSV file could not be read (unbalanced quotes?). Save it again and retry.')
  if (refused) throw refused
  return [{ name: fileName.replace(/\.[^.]+$/, '').slice(0, 100) || 'CSV', rows, formulas: [], colCount }]
}
