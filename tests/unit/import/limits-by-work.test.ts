import ExcelJS from 'exceljs'
import { describe, expect, it } from 'vitest'
import { readStreaming, readWorkbook } from '~~/server/lib/import/read-workbook'
import { validateMapping, validateMappingInSlices } from '~~/server/lib/import/validate'
import type { StoredSheet } from '~~/server/lib/import/stored-sheet'
import type { ImportMapping } from '#shared/schemas/imports'
import { IMPORT_CELLS_CAP } from '#shared/import-caps'

// Imports are capped by work (cells = rows x columns over all sheets), and the preview's checks run in slices so the
// server answers other requests meanwhile, with the same findings as in one go.

const mapping = (values: number): ImportMapping => ({
  sheet: 'S', headerRow: 0, axisColumn: 0, axis: 'age', axisUnit: 'years', edits: { '5:1': '0.5' }, description: '',
  columns: Array.from({ length: values }, (_, i) => ({ index: i + 1, name: `v${i}`, kind: 'mortality', valueUnit: 'per-unit' })),
})

function sheet(rows: number, cols: number): StoredSheet {
  const out: (string | null)[][] = [['age', ...Array.from({ length: cols - 1 }, (_, i) => `v${i}`)]]
  for (let r = 0; r < rows; r++) out.push([String(r), ...Array.from({ length: cols - 1 }, (_, i) => (r === 7 && i === 2 ? 'n/a' : (r === 9 ? '' : `0.00${(r + i) % 97 + 1}`)))])
  out[40] = [String(3), '0.1'] // a duplicate age: an error finding
  return { name: 'S', rows: out, formulas: ['12:3'], colCount: cols }
}

describe('checks in slices', () => {
  it('find exactly what the one-go check finds', async () => {
    const s = sheet(600, 8)
    expect(await validateMappingInSlices(s, mapping(7))).toEqual(validateMapping(s, mapping(7)))
  })
  it('let a timer run while they work (the event loop is not held)', async () => {
    const s = sheet(8000, 6)
    let ticks = 0
    const timer = setInterval(() => { ticks++ }, 1)
    const started = performance.now()
    await validateMappingInSlices(s, mapping(5), 2)
    const ms = performance.now() - started
    clearInterval(timer)
    expect(ms).toBeGreaterThan(20) // long enough to need slices at all
    expect(ticks).toBeGreaterThan(2)
  })
})

describe('cells cap', () => {
  it('refuses a CSV over the cap, naming the count and the limit', async () => {
    const row = Array.from({ length: 5 }, () => '1').join(',')
    const csv = (rows: number) => Buffer.from(`${Array.from({ length: rows }, () => row).join('\n')}\n`)
    await expect(readWorkbook('wide.csv', csv(201), 1000)).rejects.toMatchObject({ statusCode: 413, message: expect.stringMatching(/201 rows × 5 columns = 1,005 cells; an upload may have at most 1,000/) })
    expect((await readWorkbook('fits.csv', csv(200), 1000)).sheets[0]!.rows).toHaveLength(200)
  })
  it(`the cap is ${IMPORT_CELLS_CAP.toLocaleString('en-GB')} cells unless a test says otherwise`, async () => {
    await expect(readWorkbook('one.csv', Buffer.from('a,b\n1,2\n'))).resolves.toBeTruthy()
    expect(IMPORT_CELLS_CAP).toBe(1_000_000)
  })
  it('counts the cells of every sheet of a workbook together, in memory and streaming alike', async () => {
    // two sheets of 30 rows x 5 columns (150 cells each) against a cap of 250: each fits, both together do not
    const wb = new ExcelJS.Workbook()
    for (const name of ['A', 'B']) {
      const ws = wb.addWorksheet(name)
      for (let r = 0; r < 30; r++) ws.addRow([r, 0.01, 0.02, 0.03, 0.04])
    }
    const file = Buffer.from(await wb.xlsx.writeBuffer())
    const refusal = { statusCode: 413, message: expect.stringMatching(/more than 250 cells \(rows × columns, over all its sheets\)/) }
    await expect(readWorkbook('two.xlsx', file, 250)).rejects.toMatchObject(refusal)
    await expect(readStreaming(file, 250)).rejects.toMatchObject(refusal)
    expect((await readWorkbook('two.xlsx', file, 300)).sheets.map(s => s.rows.length)).toEqual([30, 30])
  })
})
