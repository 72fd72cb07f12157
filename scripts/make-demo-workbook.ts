// Writes the demo import files (invented data): public/demo/larkspur-pensioner-study-2026.xlsx and its CSV twin.
// Usage: npx tsx scripts/make-demo-workbook.ts
import { mkdirSync, writeFileSync } from 'node:fs'
import ExcelJS from 'exceljs'
import { D, canonicalDecimal } from '../shared/decimal-text'
import { makehamQx } from './seed/tables'

const AGES = Array.from({ length: 12 }, (_, i) => 55 + 5 * i)
const pct = (q: string) => canonicalDecimal(new D(q).mul(100).toDecimalPlaces(4))
const male = makehamQx('0.00042', '0.000036', '1.0975', AGES, 0.03, 11).map(p => pct(p.y))
const female = makehamQx('0.00031', '0.000022', '1.0995', AGES, 0.03, 17).map(p => pct(p.y))

const NOTES = [
  'Larkspur Mutual: pensioner mortality study 2026 (INVENTED DEMO DATA, not a real study)',
  'Crude rates q_x in percent, by age last birthday; one value is missing (n/a) on purpose.',
]
const HEADER = ['Age', 'Male q_x (%)', 'Female q_x (%)', 'Comment']
// the bad cell lands at C17 (female, age 110): the import must flag it and let the analyst fix it
const rows = AGES.map((age, i) => [age, Number(male[i]), i === AGES.length - 1 ? 'n/a' : Number(female[i]), i === 0 ? 'youngest age in the study' : ''])

export async function makeDemoWorkbook(): Promise<{ xlsx: Buffer; csv: string }> {
  const wb = new ExcelJS.Workbook()
  wb.creator = 'Knotwork demo'
  wb.created = new Date('2026-10-01T00:00:00Z')
  wb.modified = wb.created
  const ws = wb.addWorksheet('Study 2026')
  ws.getCell('A1').value = NOTES[0]
  ws.getCell('A2').value = NOTES[1]
  ws.getRow(5).values = HEADER
  ws.getRow(5).font = { bold: true }
  rows.forEach((r, i) => { ws.getRow(6 + i).values = r })
  ws.getColumn(1).width = 8
  ws.getColumn(2).width = 16
  ws.getColumn(3).width = 16
  ws.getColumn(4).width = 28
  const readme = wb.addWorksheet('Read me')
  readme.getCell('A1').value = 'Invented demo workbook for Knotwork. Import the sheet "Study 2026".'
  const xlsx = Buffer.from(await wb.xlsx.writeBuffer())
  const quote = (v: unknown) => (/[",\n]/.test(String(v)) ? `"${String(v).replace(/"/g, '""')}"` : String(v))
  const csv = [NOTES[0], NOTES[1], '', '', HEADER, ...rows].map(r => (Array.isArray(r) ? r.map(quote).join(',') : quote(r))).join('\n') + '\n'
  return { xlsx, csv }
}

if (import.meta.url === `file://${process.argv[1]}`) {
  const { xlsx, csv } = await makeDemoWorkbook()
  mkdirSync('public/demo', { recursive: true })
  writeFileSync('public/demo/larkspur-pensioner-study-2026.xlsx', xlsx)
  writeFileSync('public/demo/larkspur-pensioner-study-2026.csv', csv)
  console.log(`wrote public/demo/larkspur-pensioner-study-2026.xlsx (${xlsx.length} bytes) and .csv`)
}
