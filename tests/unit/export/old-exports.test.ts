import { readFileSync } from 'node:fs'
import ExcelJS from 'exceljs'
import { describe, expect, it } from 'vitest'
import { readWorkbookCells, verifyWorkbookCells } from '~~/server/lib/signing'

// Exports written before issue 11 changed the workbook (format knotwork-signed-table/1), committed as files:
// - v1-demo-curve.xlsx: downloaded from the server (demo discount curve, signed off, PCHIP fill on monthly terms);
// - v1-text-order.xlsx: written by the same writer with points in the text order the old export query gave
//   ("100" before "55"), as exports made before that query was fixed carry them.
// Every later change to signing must keep them genuine: people hold these files.
const DIR = 'tests/fixtures/exports'
const load = (name: string) => ({
  file: readFileSync(`${DIR}/${name}.xlsx`),
  keys: (JSON.parse(readFileSync(`${DIR}/${name}.jwks.json`, 'utf8')) as { keys: { kid: string; x: string }[] }).keys,
})

describe('exports of the first signed format still verify', () => {
  for (const name of ['v1-demo-curve', 'v1-text-order']) {
    it(`${name} is genuine with its published key, and a changed value cell is named`, async () => {
      const { file, keys } = load(name)
      const lookup = (kid: string) => keys.find(k => k.kid === kid)?.x ?? null
      const verdict = verifyWorkbookCells(await readWorkbookCells(file), lookup)
      expect(verdict.kind).toBe('genuine')
      if (verdict.kind === 'genuine') expect(verdict.content.format).toBe('knotwork-signed-table/1')
      const wb = new ExcelJS.Workbook()
      await wb.xlsx.load(file as unknown as ArrayBuffer)
      const cell = wb.getWorksheet('Filled values')!.getCell('B5')
      cell.value = Number(cell.value) * 2
      const altered = verifyWorkbookCells(await readWorkbookCells(Buffer.from(await wb.xlsx.writeBuffer())), lookup)
      expect(altered.kind === 'altered' && altered.differences.map(d => d.cell)).toEqual(['Filled values!B5'])
    })
  }
})
