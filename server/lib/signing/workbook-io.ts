import ExcelJS from 'exceljs'
import { canonicalBytes, contentSha256, type Pair, type SignedContentV1, type SignedContentV2, type SignedContentV3 } from './content'
import type { SignedHead } from './anchor'
import { unescapeText } from './escape'
import { fromRows, type JsonRow, type RowType } from './json-rows'
import { ABOUT_FIRST_DATA_ROW, SHEET, type CellValue, type SheetModel, type SignatureBlock } from './workbook-model'
import { workbookModelV2 } from './workbook-v2'

export type SheetCells = Map<string, CellValue[][]>
export const READ_CAPS = { sheets: 12, rowsPerSheet: 200_000, columns: 64 } as const

/** Writes sheets exactly as modelled (nothing else in any cell); headings bold, the value sheets' first row frozen. */
export async function writeWorkbook(sheets: SheetModel[], at: string): Promise<Buffer> {
  const wb = new ExcelJS.Workbook()
  wb.creator = 'Knotwork'
  wb.created = new Date(at)
  wb.modified = new Date(at)
  for (const sheet of sheets) {
    const ws = wb.addWorksheet(sheet.name)
    sheet.widths.forEach((w, i) => { ws.getColumn(i + 1).width = w })
    sheet.rows.forEach((row, r) => row.forEach((value, c) => { if (value !== null) ws.getCell(r + 1, c + 1).value = value }))
    const pairs = sheet.name.startsWith(SHEET.filled) || sheet.name.startsWith(SHEET.given)
    if (pairs) {
      ws.getRow(1).font = { bold: true }
      ws.views = [{ state: 'frozen', ySplit: 1 }]
    } else {
      // a row with one text cell is a title or a section heading
      sheet.rows.forEach((row, r) => { if (row.length === 1 && typeof row[0] === 'string') ws.getRow(r + 1).font = { bold: true } })
      if (sheet.name === SHEET.about) ws.getRow(ABOUT_FIRST_DATA_ROW).font = { bold: true }
    }
    if (!pairs) ws.getColumn(2).alignment = { wrapText: true, vertical: 'top' }
  }
  return Buffer.from(await wb.xlsx.writeBuffer())
}

/** Writes a signed workbook of the current format: readable sheets, then the signature and the audit-trail head. */
export async function writeSignedWorkbook(content: SignedContentV2 | SignedContentV3, block: Omit<SignatureBlock, 'sha256'>, anchor: SignedHead | null): Promise<Buffer> {
  const canonical = canonicalBytes(content).toString('utf8')
  return writeWorkbook(workbookModelV2(content, { ...block, sha256: contentSha256(content) }, canonical, anchor), content.signedAt)
}

/** A cell as the comparison sees it; anything but text, number or true/false becomes a marker text that never matches. */
function plain(value: ExcelJS.CellValue): CellValue {
  if (value === null || value === undefined) return null
  if (typeof value === 'string' || typeof value === 'number' || typeof value === 'boolean') return value === '' ? null : value
  if (value instanceof Date) return `[a date: ${value.toISOString()}]`
  if ('formula' in value || 'sharedFormula' in value) return `[a formula: =${'formula' in value ? value.formula : value.sharedFormula}]`
  if ('richText' in value) return value.richText.map(r => r.text).join('') || null
  if ('error' in value) return `[an error value: ${value.error}]`
  if ('text' in value) return `[a link: ${String(value.text)}]`
  return '[an unreadable cell]'
}

/** Every non-empty cell of every sheet, by 0-based row and column. */
export async function readWorkbookCells(data: Buffer): Promise<SheetCells> {
  const wb = new ExcelJS.Workbook()
  await wb.xlsx.load(data as unknown as ArrayBuffer)
  if (wb.worksheets.length > READ_CAPS.sheets) throw new Error(`the workbook has more than ${READ_CAPS.sheets} sheets`)
  const sheets: SheetCells = new Map()
  for (const ws of wb.worksheets) {
    if (ws.rowCount > READ_CAPS.rowsPerSheet || ws.columnCount > READ_CAPS.columns) throw new Error(`the sheet "${ws.name}" is larger than a signed table can be`)
    const grid: CellValue[][] = []
    ws.eachRow({ includeEmpty: false }, (row, r) => {
      row.eachCell({ includeEmpty: false }, (cell, c) => {
        const v = plain(cell.value)
        if (v === null) return
        const line = (grid[r - 1] ??= [])
        line[c - 1] = v
      })
    })
    sheets.set(ws.name, Array.from(grid, row => Array.from(row ?? [], v => v ?? null)))
  }
  return sheets
}

const text = (v: CellValue | undefined): string | null => (typeof v === 'string' ? unescapeText(v) : null)

function pairsOf(rows: CellValue[][] | undefined, sheet: string): Pair[] {
  if (!rows) throw new Error(`the sheet "${sheet}" is missing`)
  return rows.slice(1).map((row, i) => {
    const x = text(row[2])
    const y = text(row[3])
    if (x === null || y === null) throw new Error(`${sheet} row ${i + 2}: the exact decimal columns are empty`)
    return [x, y]
  })
}

/** Rebuilds signed content of the first format from its visible sheets (exact decimal columns and content paths). */
export function contentFromSheets(sheets: SheetCells): SignedContentV1 {
  const about = sheets.get(SHEET.about)
  if (!about) throw new Error(`the sheet "${SHEET.about}" is missing`)
  const rows: JsonRow[] = about.slice(ABOUT_FIRST_DATA_ROW).map((row) => {
    const path = text(row[2])
    const type = text(row[3]) as RowType | null
    if (!path || !type) throw new Error(`${SHEET.about}: a row without content path or type`)
    const raw = row[1] ?? null
    return { path, type, value: typeof raw === 'string' ? unescapeText(raw) : raw }
  })
  const base = fromRows(rows) as unknown as SignedContentV1
  const fill = base.fill ? { ...base.fill, values: pairsOf(sheets.get(SHEET.filled), SHEET.filled) } : null
  return { ...base, points: pairsOf(sheets.get(SHEET.given), SHEET.given), fill }
}
