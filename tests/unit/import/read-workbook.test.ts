// The two ways an .xlsx is read (whole in memory up to 8 MiB inflated, streaming above) must store the same cells.
import { readFileSync } from 'node:fs'
import ExcelJS from 'exceljs'
import { describe, expect, it } from 'vitest'
import { readInMemory, readStreaming, readWorkbook } from '~~/server/lib/import/read-workbook'

const demo = readFileSync('public/demo/larkspur-pensioner-study-2026.xlsx')

async function workbook(fill: (wb: ExcelJS.Workbook) => void): Promise<Buffer> {
  const wb = new ExcelJS.Workbook()
  fill(wb)
  return Buffer.from(await wb.xlsx.writeBuffer())
}

describe('reading an .xlsx', () => {
  it('the demo workbook: the in-memory and the streaming reader store the same cells', async () => {
    const whole = await readInMemory(demo)
    expect(whole.map(s => s.name)).toEqual((await readWorkbook('demo.xlsx', demo)).sheets.map(s => s.name))
    expect(await readStreaming(demo)).toEqual(whole)
    expect(whole[0]!.rows.flat().filter(Boolean).length).toBeGreaterThan(20)
  })

  it('percent formats, shared strings, dates, gaps and formulas read alike both ways', async () => {
    const file = await workbook((wb) => {
      const ws = wb.addWorksheet('Rates')
      ws.addRow(['Age', 'q_x', 'Note'])
      ws.addRow([60, 0.0123, 'graduated'])
      ws.getCell('B2').numFmt = '0.00%'
      ws.addRow([65, { formula: 'B2*1.5', result: 0.01845 }, new Date(Date.UTC(2026, 8, 30))])
      ws.getCell('A6').value = 80 // rows 4 and 5 left empty
      wb.addWorksheet('Empty')
    })
    const whole = await readInMemory(file)
    expect(await readStreaming(file)).toEqual(whole)
    const rates = whole.find(s => s.name === 'Rates')!
    expect(rates.rows[1]).toEqual(['60', '1.23%', 'graduated'])
    expect(rates.rows[2]).toEqual(['65', '0.01845', '2026-09-30'])
    expect(rates.formulas).toEqual(['2:1'])
    expect(rates.rows[5]).toEqual(['80'])
    expect(rates.rows[3]).toEqual([])
  })
})
