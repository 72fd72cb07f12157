// Writes the demo matrix workbook (invented data, issue 17): public/demo/larkspur-select-study-2026.xlsx, a select table
// with entry ages down, durations 0 to 4 across and an "Ult" column, q in per mille, given at every fifth entry age.
// Usage: npx tsx scripts/make-demo-select-workbook.ts
import { mkdirSync, writeFileSync } from 'node:fs'
import ExcelJS from 'exceljs'
import { D } from '../shared/decimal-text'
import { SELECT_DURATIONS, SELECT_ENTRY_AGES, demoSelectCells } from './seed/select-table'

const NOTES = [
  'Larkspur Mutual: term assurance select mortality study 2026 (INVENTED DEMO DATA, not a real study)',
  'q per mille by age at entry and duration since entry; select period 5 years; Ult = ultimate rate at attained age entry + 5.',
  'Blank rows are entry ages to fill.',
]
export const SELECT_HEADER = ['Age at entry', ...SELECT_DURATIONS.map(String), 'Ult']

export function selectRows(): (number | null)[][] {
  const cells = demoSelectCells()
  const perMille = (x: number, d: string | null) => {
    const c = cells.find(k => k.x === String(x) && k.d === d)
    return c ? Number(new D(c.y).mul(1000).toString()) : null
  }
  return SELECT_ENTRY_AGES.map(x => [x, ...SELECT_DURATIONS.map(d => perMille(x, String(d))), perMille(x, null)])
}

export async function makeSelectWorkbook(): Promise<Buffer> {
  const wb = new ExcelJS.Workbook()
  wb.creator = 'Knotwork demo'
  wb.created = new Date('2026-10-01T00:00:00Z')
  wb.modified = wb.created
  const ws = wb.addWorksheet('Select 2026')
  NOTES.forEach((n, i) => { ws.getCell(`A${i + 1}`).value = n })
  ws.getRow(5).values = SELECT_HEADER
  ws.getRow(5).font = { bold: true }
  const rows = selectRows()
  rows.forEach((r, i) => { ws.getRow(6 + i).values = r.map(v => v ?? undefined) as ExcelJS.CellValue[] })
  ws.getCell(`A${6 + rows.length + 1}`).value = 'Source: invented for the Knotwork demo.'
  return Buffer.from(await wb.xlsx.writeBuffer())
}

if (import.meta.url === `file://${process.argv[1]}`) {
  const xlsx = await makeSelectWorkbook()
  mkdirSync('public/demo', { recursive: true })
  writeFileSync('public/demo/larkspur-select-study-2026.xlsx', xlsx)
  console.log(`wrote public/demo/larkspur-select-study-2026.xlsx (${xlsx.length} bytes)`)
}
