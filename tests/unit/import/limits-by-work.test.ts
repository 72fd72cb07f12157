import ExcelJS from 'exceljs'
import { describe, expect, it } from 'vitest'
import { readStreaming, readWorkbook } from '~~/server/lib/import/read-workbook'
import { IMPORT_CELLS_CAP } from '#shared/import-caps'

// Imports are capped by work: cells = rows x columns over all sheets.

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
