// Matrix sheets (issue 17): ages down, durations across, the ultimate column found by its heading; blanks left to fill;
// notes rows, cell-named findings, per-mille values converted exactly to per-unit decimals.
import { describe, expect, it } from 'vitest'
import { headingValue, suggestMatrix, validateMatrix } from '~~/server/lib/import/matrix'
import type { StoredSheet } from '~~/server/lib/import/stored-sheet'
import type { ImportMatrixMapping } from '#shared/schemas/import-matrix'

const sheet = (rows: (string | null)[][], formulas: string[] = []): StoredSheet => ({ name: 'Select', rows, formulas, colCount: Math.max(...rows.map(r => r.length)) })
const SELECT = sheet([
  ['Invented select mortality, q per mille', null, null, null],
  [null],
  ['Age at entry', '0', '1', 'Ult'],
  ['30', '0.5', '0.7', '1.1'],
  ['31', null, null, null],
  ['32', '0.6', '0.85', '1.3'],
  ['Source: invented for a test', null, null, null],
])
const mapping = (over: Partial<ImportMatrixMapping> = {}): ImportMatrixMapping => ({
  sheet: 'Select', headerRow: 2, axisColumn: 0, columns: [1, 2, 3], axis: 'age', axisUnit: 'years', colAxis: 'duration', colAxisUnit: 'years',
  name: 'Select test', kind: 'mortality', valueUnit: 'per-mille', edits: {}, description: '', ...over,
})

describe('matrix headings', () => {
  it('reads durations and the ultimate column from the headings', () => {
    expect(['0', '1.0', 'Duration 2', 'd=3', 'Year 4', 'Ult', 'Ult.', 'Ultimate', 'ultimate rate', 'Notes', ''].map(headingValue))
      .toEqual(['0', '1', '2', '3', '4', 'ult', 'ult', 'ult', 'ult', null, null])
  })

  it('suggests the header row under the notes, the columns and per mille from the notes', () => {
    expect(suggestMatrix(SELECT)).toMatchObject({ headerRow: 2, axisColumn: 0, columns: [1, 2, 3], kind: 'mortality', valueUnit: 'per-mille', hasUltimate: true })
  })

  it('does not take a one-way sheet (value columns with names, rows of numbers) for a matrix', () => {
    expect(suggestMatrix(sheet([['Notes'], ['Age', 'Male q_x (%)', 'Female q_x (%)'], ['55', '0.5', '0.4'], ['60', '0.8', '0.6']]))).toBeNull()
  })
})

describe('validateMatrix', () => {
  it('keeps the given cells as per-unit decimals, counts the blanks to fill, skips notes rows', () => {
    const v = validateMatrix(SELECT, mapping())
    expect(v.findings).toEqual([])
    expect(v.rows).toBe(3)
    expect(v.blanks).toBe(3)
    expect(v.hasUltimate).toBe(true)
    expect(v.cells).toEqual([
      { x: '30', d: '0', y: '0.0005' }, { x: '30', d: '1', y: '0.0007' }, { x: '30', d: null, y: '0.0011' },
      { x: '32', d: '0', y: '0.0006' }, { x: '32', d: '1', y: '0.00085' }, { x: '32', d: null, y: '0.0013' },
    ])
  })

  it('names the cell of each problem: a formula, text, an out-of-range value, a second ultimate heading, a hole in the given rectangle', () => {
    const bad = sheet([
      ['Age', '0', '1', 'Ult', 'Ultimate'],
      ['30', '0.5', 'n/a', '1.1', '1'],
      ['32', '1200', null, '1.3', '1'],
      ['34', '0.7', '0.9', '1.5', '1'],
    ], ['3:1'])
    const v = validateMatrix(bad, mapping({ headerRow: 0, columns: [1, 2, 3, 4] }))
    const at = (code: string) => v.findings.filter(f => f.code === code).map(f => f.cell)
    expect(at('duplicate-heading')).toEqual(['E1'])
    expect(at('not-a-number')).toEqual(['C2'])
    expect(at('out-of-range')).toEqual(['B3'])
    expect(at('formula')).toEqual(['B4'])
    expect(at('not-rectangular')).toEqual(['C2'])
    // a fix typed in the preview replaces the cell
    const fixed = validateMatrix(bad, mapping({ headerRow: 0, columns: [1, 2, 3], edits: { '1:2': '0.72', '2:1': '0.6', '2:2': '0.8', '3:1': '0.7' } }))
    expect(fixed.findings).toEqual([])
    expect(fixed.cells).toHaveLength(9)
  })
})
