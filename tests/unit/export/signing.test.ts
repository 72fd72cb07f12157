import { verify as nodeVerify, createPublicKey } from 'node:crypto'
import ExcelJS from 'exceljs'
import fc from 'fast-check'
import { describe, expect, it } from 'vitest'
import {
  SIGNED_FORMAT_V1, SHEET_V2, canonicalBytes, contentSha256, readWorkbookCells, signatureSheetField, verifyWorkbookCells, workbookModel, writeSignedWorkbook, writeWorkbook,
  type SignedContentV1, type SignedContentV2,
} from '~~/server/lib/signing'
import { canonicalJson } from '~~/server/lib/canonical-json'
import { arbitraryContent, headOf, signatureOf, testKey } from './fixtures'

const key = testKey()
const lookup = (kid: string) => (kid === key.kid ? key.x : null)
const RUNS = { numRuns: 25 }
const SHEET = SHEET_V2

async function edited(file: Buffer, change: (wb: ExcelJS.Workbook) => void) {
  const wb = new ExcelJS.Workbook()
  await wb.xlsx.load(file as unknown as ArrayBuffer)
  change(wb)
  return readWorkbookCells(Buffer.from(await wb.xlsx.writeBuffer()))
}

describe('signed export (format 2): property tests over random small tables', () => {
  it('export then verify is genuine, and the audit-trail head comes back with its own signature', async () => {
    await fc.assert(fc.asyncProperty(arbitraryContent(key.kid), async (content) => {
      const head = headOf(key)
      const file = await writeSignedWorkbook(content, signatureOf(content, key), head)
      const verdict = verifyWorkbookCells(await readWorkbookCells(file), lookup)
      expect(verdict.kind).toBe('genuine')
      if (verdict.kind !== 'genuine') return
      expect(canonicalBytes(verdict.content).equals(canonicalBytes(content))).toBe(true)
      expect(verdict.anchor).toEqual(head)
    }), RUNS)
  })

  it('changing any one value cell (the number or the every-digit text) makes verify fail and name that cell', async () => {
    await fc.assert(fc.asyncProperty(arbitraryContent(key.kid), fc.nat(), fc.boolean(), async (content, pick, exactColumn) => {
      const file = await writeSignedWorkbook(content, signatureOf(content, key), headOf(key))
      const sheetName = content.fill?.values.length ? SHEET.filled : SHEET.given
      const pairs = content.fill?.values.length ? content.fill.values : content.points
      const row = 2 + (pick % pairs.length)
      const col = exactColumn ? 'C' : 'B'
      const verdict = verifyWorkbookCells(await edited(file, (wb) => {
        const cell = wb.getWorksheet(sheetName)!.getCell(`${col}${row}`)
        cell.value = exactColumn ? `${String(cell.value)}1` : Number(cell.value) + 1
      }), lookup)
      expect(verdict.kind).toBe('altered')
      if (verdict.kind === 'altered') expect(verdict.differences.map(d => d.cell)).toEqual([`${sheetName}!${col}${row}`])
    }), RUNS)
  })

  it('reading and re-saving the workbook through exceljs keeps it verifiable (the signature does not cover zip bytes)', async () => {
    await fc.assert(fc.asyncProperty(arbitraryContent(key.kid), async (content) => {
      const file = await writeSignedWorkbook(content, signatureOf(content, key), headOf(key))
      const sheets = await edited(file, (wb) => {
        wb.modified = new Date('2030-01-01T00:00:00Z')
        wb.getWorksheet(SHEET.filled)!.getColumn(1).width = 30
      })
      expect(verifyWorkbookCells(sheets, lookup).kind).toBe('genuine')
    }), { numRuns: 10 })
  })

  it('files of the first format written by its frozen model still verify, with the content rebuilt from their sheets', async () => {
    await fc.assert(fc.asyncProperty(arbitraryContent(key.kid), async (c) => {
      const { fill, ...rest } = c
      const v1: SignedContentV1 = { ...rest, format: SIGNED_FORMAT_V1, fill: fill ? (({ fittedOn: _f, ...f }) => f)(fill) : null }
      const sig = signatureOf(v1 as never, key)
      const file = await writeWorkbook(workbookModel(v1, { ...sig, sha256: contentSha256(v1) }, canonicalBytes(v1).toString('utf8')), v1.signedAt)
      const verdict = verifyWorkbookCells(await readWorkbookCells(file), lookup)
      expect(verdict.kind === 'genuine' && verdict.content.format).toBe(SIGNED_FORMAT_V1)
    }), { numRuns: 10 })
  })
})

describe('signed export (format 2): fixed cases', () => {
  const base = fc.sample(arbitraryContent(key.kid), { numRuns: 1, seed: 7 })[0]!
  const content = {
    ...base,
    table: { ...base.table, kind: 'mortality', axis: 'age', valueUnit: 'per-mille' },
    points: [['55', '0.0061'], ['60', '0.0094'], ['100', '0.35']] as [string, string][],
    fill: { ...base.fill!, spec: { method: 'quadratic', options: { condition: 'right-zero-curvature' }, transform: 'log', extrapolation: 'error', precision: 40, grid: { from: '55', to: '100', step: '1' }, at: null }, values: [['55', '0.0061'], ['56', '0.00665'], ['100', '0.35']] as [string, string][], fittedOn: { contentHash: base.version.contentHash, lockVersion: 7 } },
  }
  const write = (c = content) => writeSignedWorkbook(c, signatureOf(c, key), headOf(key))

  it('headings name the axis and the unit; values read in the table\u2019s unit with the per-unit value beside; options read in words', async () => {
    const sheets = await readWorkbookCells(await write())
    expect(sheets.get(SHEET.filled)!.slice(0, 3)).toEqual([
      ['Age (years)', 'q_x (per mille)', 'q_x (per mille), every digit', 'q_x per unit, every digit'],
      [55, 6.1, '6.1', '0.0061'],
      [56, 6.65, '6.65', '0.00665'],
    ])
    const about = sheets.get(SHEET.about)!.map(r => r.join(' | '))
    expect(about).toContain('Method | Quadratic spline')
    expect(about).toContain('Extra condition | Straight last piece')
    expect(about).toContain('Interpolated on | Logarithm')
    expect(about.join('\n')).not.toMatch(/right-zero-curvature|\/fill\/spec/)
    expect(about.find(r => r.startsWith('Fitted on'))).toMatch(/the given points of this version/)
  })

  it('a curve says how its rates compound, in the table and in the fill; changing those words is altered; a file without them reads as before', async () => {
    const curve = {
      ...content,
      table: { ...content.table, kind: 'spot-rate', axis: 'term', valueUnit: 'percent', compounding: 'continuous' },
      points: [['1', '0.03'], ['5', '0.035']] as [string, string][],
      fill: { ...content.fill, spec: { method: 'monotone-convex', options: {}, transform: 'none', extrapolation: 'flat', compounding: 'continuous', precision: 40, grid: { from: '1', to: '5', step: '1' }, at: null }, values: [['1', '0.03'], ['5', '0.035']] as [string, string][] },
    }
    const writeAny = (c: object) => writeSignedWorkbook(c as SignedContentV2, signatureOf(c as SignedContentV2, key), headOf(key))
    const file = await writeAny(curve)
    const about = (await readWorkbookCells(file)).get(SHEET.about)!.map(r => r.join(' | '))
    expect(about.filter(r => r === 'Rates read as | Continuous compounding')).toHaveLength(2)
    const verdict = verifyWorkbookCells(await edited(file, (wb) => {
      wb.getWorksheet(SHEET.about)!.eachRow((row) => { if (row.getCell(2).value === 'Continuous compounding') row.getCell(2).value = 'Annual compounding' })
    }), lookup)
    expect(verdict.kind).toBe('altered')
    // content signed before curves stated their compounding has no such row and still verifies
    const { compounding: _, ...older } = curve.table
    const old = { ...curve, table: older, fill: { ...curve.fill, spec: { ...curve.fill.spec, compounding: undefined } } }
    const oldSheets = await readWorkbookCells(await writeAny(JSON.parse(JSON.stringify(old))))
    expect(oldSheets.get(SHEET.about)!.map(r => r.join(' | ')).some(r => r.startsWith('Rates read as'))).toBe(false)
    expect(verifyWorkbookCells(oldSheets, lookup).kind).toBe('genuine')
  })

  it('text that starts with = + - @ is written with a leading apostrophe, never as a formula', async () => {
    const risky = { ...content, table: { ...content.table, name: '=HYPERLINK("http://x","y")' } }
    const file = await write(risky)
    const wb = new ExcelJS.Workbook()
    await wb.xlsx.load(file as unknown as ArrayBuffer)
    const cells: unknown[] = []
    wb.getWorksheet(SHEET.about)!.eachRow(row => row.eachCell(c => cells.push(c.value)))
    expect(cells.some(v => typeof v === 'object' && v !== null && 'formula' in v)).toBe(false)
    expect(cells).toContain('\'=HYPERLINK("http://x","y")')
    expect(verifyWorkbookCells(await readWorkbookCells(file), lookup).kind).toBe('genuine')
  })

  it('a key id that is not published gives "unknown key"; one that starts with "-" is read back without the formula guard', async () => {
    expect(verifyWorkbookCells(await readWorkbookCells(await write()), () => null)).toEqual({ kind: 'unknown-key', keyId: key.kid })
    let dashed = testKey()
    while (!dashed.kid.startsWith('-')) dashed = testKey()
    const c = { ...content, keyId: dashed.kid }
    const sheets = await readWorkbookCells(await writeSignedWorkbook(c, signatureOf(c, dashed), headOf(dashed)))
    expect(signatureSheetField(sheets, 'Key id')).toBe(dashed.kid)
    expect(verifyWorkbookCells(sheets, kid => (kid === dashed.kid ? dashed.x : null)).kind).toBe('genuine')
  })

  it('a formula in a value cell, a changed stored content, or a changed audit-trail head is reported as altered', async () => {
    const file = await write()
    const formula = verifyWorkbookCells(await edited(file, (wb) => { wb.getWorksheet(SHEET.given)!.getCell('B2').value = { formula: '1+1', result: 2 } }), lookup)
    expect(formula.kind === 'altered' && formula.differences.map(d => d.cell)).toEqual([`${SHEET.given}!B2`])
    const rowOf = (wb: ExcelJS.Workbook, label: string) => { let at = 0; wb.getWorksheet('Signature')!.eachRow((r, n) => { if (String(r.getCell(1).value).startsWith(label)) at = n }); return at }
    const stored = verifyWorkbookCells(await edited(file, (wb) => { const c = wb.getWorksheet('Signature')!.getCell(`B${rowOf(wb, 'Signed content, part 1')}`); c.value = String(c.value).replace('"number":3', '"number":4') }), lookup)
    expect(stored.kind === 'altered' && stored.reason).toMatch(/stored content/)
    const head = verifyWorkbookCells(await edited(file, (wb) => { const c = wb.getWorksheet('Signature')!.getCell(`B${rowOf(wb, 'Audit trail head statement, part 1')}`); c.value = String(c.value).replace('"number":41', '"number":40') }), lookup)
    expect(head.kind === 'altered' && head.reason).toMatch(/audit-trail head/)
  })

  // Outside reference: RFC 8785's own implementation (the "canonicalize" package by the RFC's authors)
  // and our hand-written canonical-json.ts agree on the signed bytes.
  it('canonical bytes agree with server/lib/canonical-json.ts', () => {
    expect(canonicalBytes(content).toString('utf8')).toBe(canonicalJson(content))
  })

  // Outside reference: Node's own crypto.verify with only the public JWK, no Knotwork code on the verify side.
  it('the signature verifies with crypto.verify(null, data, publicKey, sig)', () => {
    const { signature } = signatureOf(content, key)
    const publicKey = createPublicKey({ key: { kty: 'OKP', crv: 'Ed25519', x: key.x }, format: 'jwk' })
    expect(nodeVerify(null, canonicalBytes(content), publicKey, Buffer.from(signature, 'base64'))).toBe(true)
    const tampered = Buffer.from(canonicalBytes(content))
    tampered[10] ^= 1
    expect(nodeVerify(null, tampered, publicKey, Buffer.from(signature, 'base64'))).toBe(false)
  })
})
