// Format 3 (issue 17): a two-way table's signed workbook, made from a real two-way fill of the demo's invented select
// cells, verifies as genuine; the Given cells and Filled values sheets carry the column axis and the ultimate column;
// a changed cell is named, and a file whose stored content claims format 2 does not verify.
import ExcelJS from 'exceljs'
import { describe, expect, it } from 'vitest'
import { fillSelect } from '~~/server/engine'
import { SIGNED_FORMAT_V3, canonicalBytes, readWorkbookCells, verifyWorkbookCells, writeSignedWorkbook, type SignedContentV3 } from '~~/server/lib/signing'
import { demoSelectCells } from '~~/scripts/seed/select-table'
import { headOf, signatureOf, testKey } from './fixtures'

const key = testKey()
const lookup = (kid: string) => (kid === key.kid ? key.x : null)
const cells = demoSelectCells()
const filled = fillSelect({ cells, kind: 'mortality', method: { x: { method: 'linear' }, d: { method: 'linear' } }, grid: { x: { from: '30', to: '40', step: '1' }, d: { from: '0', to: '4', step: '1' } }, money: { ages: [35] } })
const person = { name: 'Priya Raman', email: 'priya.raman@larkspur.example' }
const content: SignedContentV3 = {
  format: SIGNED_FORMAT_V3,
  organisation: { slug: 'larkspur-mutual', name: 'Larkspur Mutual' },
  table: { id: '00000000-0000-4000-8000-000000000017', name: 'Select test', kind: 'mortality', axis: 'age', axisUnit: 'years', valueUnit: 'per-mille', shape: 'two-way', colAxis: 'duration', colAxisUnit: 'years', hasUltimate: true },
  version: { id: '00000000-0000-4000-8000-000000000018', number: 1, status: 'approved', contentHash: 'abc', notes: '' },
  cells: cells.filter(c => Number(c.x) <= 40).map(c => [c.x, c.d, c.y]),
  fill: {
    spec: { ...filled.spec, shape: 'two-way', bench: { grid: { x: { from: '30', to: '40', step: '1' }, d: { from: '0', to: '4', step: '1' } }, label: 'linear × linear', pointsHash: 'abc', money: { ages: [35] } } } as never,
    rationale: 'Straight lines both ways.', checks: { checks: filled.checks, maxKnotDeviation: filled.maxKnotDeviation } as never, money: filled.money as never,
    filledBy: person, filledAt: '2026-12-01T10:00:00.000Z', fittedOn: { contentHash: 'abc', lockVersion: 2 },
    values: filled.points.map(p => [p.x, p.d, p.y]),
  },
  madeBy: person, submittedBy: person, submittedAt: '2026-12-01T11:00:00.000Z',
  approvedBy: { name: 'Felix Amari', email: 'felix.amari@fenwickrowe.example' }, approvedAt: '2026-12-01T12:00:00.000Z',
  signedAt: '2026-12-02T09:00:00.000Z', keyId: key.kid,
}

async function edited(file: Buffer, change: (wb: ExcelJS.Workbook) => void) {
  const wb = new ExcelJS.Workbook()
  await wb.xlsx.load(file as unknown as ArrayBuffer)
  change(wb)
  return readWorkbookCells(Buffer.from(await wb.xlsx.writeBuffer()))
}

describe('signed export of a two-way table (format 3)', () => {
  it('verifies as genuine, with the second axis and the ultimate column on the value sheets and the checks in words', async () => {
    const file = await writeSignedWorkbook(content, signatureOf(content, key), headOf(key))
    const sheets = await readWorkbookCells(file)
    const verdict = verifyWorkbookCells(sheets, lookup)
    expect(verdict.kind).toBe('genuine')
    if (verdict.kind === 'genuine') expect(canonicalBytes(verdict.content).equals(canonicalBytes(content))).toBe(true)
    expect(sheets.get('Given cells')![0]![1]).toBe('Duration (years)')
    expect(sheets.get('Given cells')!.filter(r => r[1] === 'Ultimate')).toHaveLength(3)
    expect(sheets.get('Filled values')!).toHaveLength(1 + 11 * 6)
    const about = sheets.get('About this table')!.map(r => r[0])
    expect(about).toEqual(expect.arrayContaining(['Method along age', 'Method along duration', 'Select below ultimate', 'Annuity-due, entry age 35']))
  })

  it('names a changed cell, and refuses content that claims another format', async () => {
    const file = await writeSignedWorkbook(content, signatureOf(content, key), headOf(key))
    const altered = verifyWorkbookCells(await edited(file, (wb) => { wb.getWorksheet('Given cells')!.getCell('B7').value = 'Ult' }), lookup)
    expect(altered.kind).toBe('altered')
    if (altered.kind === 'altered') expect(altered.differences.map(d => d.cell)).toEqual(['Given cells!B7'])
    const claimed = { ...content, format: 'knotwork-signed-table/2' } as unknown as SignedContentV3
    const other = await writeSignedWorkbook(content, signatureOf(claimed, key), headOf(key))
    expect(verifyWorkbookCells(await readWorkbookCells(other), lookup).kind).toBe('altered')
  })
})
