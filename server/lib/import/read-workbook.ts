import { Readable } from 'node:stream'
import ExcelJS from 'exceljs'
import { D, canonicalDecimal } from '#shared/decimal-text'
import { IMPORT_LIMITS, ImportRefused } from './limits'
import { guardXlsxZip } from './zip-guard'
import { readCsv } from './read-csv'
import { trimRow, type StoredSheet } from './stored-sheet'
import { yieldToEventLoop } from '../event-loop'

export type { StoredSheet } from './stored-sheet'

const L = IMPORT_LIMITS
const OLE = Buffer.from([0xd0, 0xcf, 0x11, 0xe0, 0xa1, 0xb1, 0x1a, 0xe1])

export function sniffKind(fileName: string, buf: Buffer): 'xlsx' | 'csv' {
  const ext = (/\.([a-z0-9]+)$/i.exec(fileName)?.[1] ?? '').toLowerCase()
  if (buf.length === 0) throw new ImportRefused(400, 'The file is empty.')
  if (buf.subarray(0, 8).equals(OLE)) {
    throw new ImportRefused(415, 'This is an encrypted workbook or a legacy .xls file (an OLE compound file). Remove the password or save it as .xlsx, then retry.')
  }
  const isZip = buf[0] === 0x50 && buf[1] === 0x4b && (buf[2] === 3 || buf[2] === 5 || buf[2] === 7)
  if (ext === 'xlsx') {
    if (!isZip) throw new ImportRefused(415, `"${fileName}" is named .xlsx but its content is not an Excel workbook.`)
    return 'xlsx'
  }
  if (ext === 'csv' || ext === 'txt') {
    if (isZip || buf.subarray(0, 4096).includes(0)) throw new ImportRefused(415, `"${fileName}" is named .${ext} but its content is not text (is it a workbook with the wrong extension?).`)
    return 'csv'
  }
  if (ext === 'xls') throw new ImportRefused(415, 'Legacy .xls files are not read; save the workbook as .xlsx and retry.')
  throw new ImportRefused(415, 'Upload an Excel workbook (.xlsx) or a CSV file (.csv).')
}

type CellValue = ExcelJS.CellValue
function cellText(value: CellValue, numFmt: string | undefined): { text: string | null; formula: boolean } {
  if (value === null || value === undefined) return { text: null, formula: false }
  if (typeof value === 'number') {
    // a percent-formatted cell holds the per-unit number; write it as the person sees it
    return { text: numFmt?.includes('%') ? `${canonicalDecimal(new D(String(value)).mul(100))}%` : String(value), formula: false }
  }
  if (typeof value === 'string') return { text: value, formula: false }
  if (typeof value === 'boolean') return { text: value ? 'TRUE' : 'FALSE', formula: false }
  if (value instanceof Date) return { text: value.toISOString().slice(0, 10), formula: false }
  if ('formula' in value || 'sharedFormula' in value) {
    const result = (value as { result?: unknown }).result
    return { text: result === undefined || result === null || typeof result === 'object' ? '' : String(result), formula: true }
  }
  if ('richText' in value) return { text: value.richText.map(r => r.text).join(''), formula: false }
  if ('error' in value) return { text: String(value.error), formula: false }
  if ('text' in value) return { text: String(value.text), formula: false }
  return { text: null, formula: false }
}

const cellsRefused = (cap: number) => new ImportRefused(413, `The workbook has more than ${cap.toLocaleString('en-GB')} cells (rows × columns, over all its sheets); remove unused rows, columns or sheets, or split it.`)

/** Cells (rows x columns) counted over the sheets of one upload, against the cap. */
interface CellBudget { used: number; cap: number }

/** The rows of one sheet into a StoredSheet, with the row, column and cell caps and formula cells noted. */
async function storeSheet(name: string, rows: AsyncIterable<ExcelJS.Row> | Iterable<ExcelJS.Row>, budget: CellBudget): Promise<StoredSheet> {
  const stored: StoredSheet = { name, rows: [], formulas: [], colCount: 0 }
  let sliceStart = performance.now()
  for await (const row of rows) {
    const r = row.number - 1
    if (r >= L.rows + 1) throw new ImportRefused(413, `Sheet '${name}' has more than ${L.rows.toLocaleString('en-GB')} rows; split the file or remove unused rows.`)
    const out: (string | null)[] = []
    row.eachCell({ includeEmpty: false }, (cell, col) => {
      if (col > L.columns) throw new ImportRefused(413, `Sheet '${name}' uses more than ${L.columns} columns; remove unused columns.`)
      const { text, formula } = cellText(cell.value, cell.numFmt)
      if (formula) stored.formulas.push(`${r}:${col - 1}`)
      out[col - 1] = text
    })
    for (let i = 0; i < out.length; i++) out[i] ??= null
    stored.rows[r] = trimRow(out)
    stored.colCount = Math.max(stored.colCount, stored.rows[r]!.length)
    if (budget.used + (r + 1) * stored.colCount > budget.cap) throw cellsRefused(budget.cap)
    if (performance.now() - sliceStart > 10) { await yieldToEventLoop(); sliceStart = performance.now() } // let other requests in
  }
  for (let i = 0; i < stored.rows.length; i++) stored.rows[i] ??= []
  budget.used += stored.rows.length * stored.colCount
  return stored
}

/** Whole workbook in memory (JSZip): deterministic; used up to IN_MEMORY_BYTES of inflated parts. */
export async function readInMemory(buf: Buffer, cellsCap: number = L.cells): Promise<StoredSheet[]> {
  const wb = new ExcelJS.Workbook()
  await wb.xlsx.load(buf as unknown as ArrayBuffer)
  const sheets: StoredSheet[] = []
  const budget: CellBudget = { used: 0, cap: cellsCap }
  for (const ws of wb.worksheets) {
    const rows: ExcelJS.Row[] = []
    ws.eachRow({ includeEmpty: false }, row => rows.push(row))
    sheets.push(await storeSheet(ws.name, rows, budget))
  }
  return sheets
}

/** Sheet by sheet, row by row (exceljs's streaming reader): bounded memory for large workbooks. */
export async function readStreaming(buf: Buffer, cellsCap: number = L.cells): Promise<StoredSheet[]> {
  const reader = new ExcelJS.stream.xlsx.WorkbookReader(Readable.from(buf), {
    sharedStrings: 'cache', hyperlinks: 'ignore', styles: 'cache', worksheets: 'emit', entries: 'emit',
  })
  const sheets: StoredSheet[] = []
  const budget: CellBudget = { used: 0, cap: cellsCap }
  for await (const ws of reader) {
    const sheet = ws as unknown as { name: string } & AsyncIterable<ExcelJS.Row>
    sheets.push(await storeSheet(sheet.name, sheet, budget))
  }
  return sheets
}

/**
 * Workbooks up to this many inflated bytes are read whole in memory. exceljs 4.4's streaming reader now and then loses
 * the end of a part when its worksheets come before xl/workbook.xml in the zip (seen about once in 400 uploads of the
 * demo workbook: "Cannot read properties of undefined (reading 'sheets')", the TypeError of exceljs issue #962, still
 * open), so it is kept for large workbooks only, and tried up to three times there.
 */
const IN_MEMORY_BYTES = 8 * 1024 * 1024
const STREAMING_TRIES = 3

async function readXlsx(buf: Buffer, cellsCap: number): Promise<StoredSheet[]> {
  const { inflatedBytes } = await guardXlsxZip(buf)
  let sheets: StoredSheet[] | null = null
  for (let attempt = 1; !sheets; attempt++) {
    try {
      sheets = inflatedBytes <= IN_MEMORY_BYTES ? await readInMemory(buf, cellsCap) : await readStreaming(buf, cellsCap)
    } catch (e) {
      if (e instanceof ImportRefused) throw e
      console.warn(`[import] xlsx read failed (${inflatedBytes} inflated bytes, attempt ${attempt}):`, (e as Error)?.stack ?? e)
      if (inflatedBytes <= IN_MEMORY_BYTES || attempt >= STREAMING_TRIES) {
        throw new ImportRefused(400, 'The workbook could not be read. Save it again as .xlsx from your spreadsheet program and retry.')
      }
    }
  }
  if (!sheets.length) throw new ImportRefused(400, 'The workbook has no sheets.')
  return sheets
}

/** Reads an upload already checked for size: sniffs its real kind, guards it, returns its cells (at most `cellsCap`). */
export async function readWorkbook(fileName: string, buf: Buffer, cellsCap: number = L.cells): Promise<{ kind: 'xlsx' | 'csv'; sheets: StoredSheet[] }> {
  const kind = sniffKind(fileName, buf)
  return { kind, sheets: kind === 'xlsx' ? await readXlsx(buf, cellsCap) : await readCsv(fileName, buf, cellsCap) }
}
