// The experience behind crude rates on import (issue 16): exposure and deaths columns are suggested by their headings
// beside a column of rates (never on a band axis, where they are totals to split, nor when they are rates themselves),
// read as plain non-negative numbers with findings that name the cell, and returned in the order of the axis.
import { describe, expect, it } from 'vitest'
import { importMappingSchema } from '#shared/schemas/imports'
import { suggestColumns } from '~~/server/lib/import/analyse'
import { validateMapping } from '~~/server/lib/import/validate'
import { previewTask } from '~~/server/lib/work/tasks/imports'
import type { StoredSheet } from '~~/server/lib/import/read-workbook'

// invented test data: the checks are about reading, not the values
const sheet = (rows: string[][]): StoredSheet => ({ name: 'study', rows: [['Age', 'Central exposure', 'Deaths', 'Crude q'], ...rows], formulas: [], colCount: 4 })
const ROWS = [['61', '980.5', '12', '0.01224'], ['60', '1000', '10', '0.01'], ['62', '950', '0', '0']]
const mapping = (experience: Record<string, unknown> = { exposureColumn: 1, deathsColumn: 2 }) => importMappingSchema.parse({
  sheet: 'study', headerRow: 0, axisColumn: 0, axis: 'age', axisUnit: 'years', columns: [{ index: 3, name: 'Crude', kind: 'mortality', valueUnit: 'per-unit' }], experience,
})

describe('experience columns', () => {
  it('are suggested beside rates, not on a band axis, not when they are rates, not when nothing else is a rate', () => {
    expect(suggestColumns(sheet(ROWS), 0).map(c => c.role)).toEqual(['axis', 'exposure', 'deaths', 'value'])
    const banded: StoredSheet = { name: 'b', rows: [['Age band', 'Exposure', 'Deaths'], ['60-64', '5000', '40'], ['65-69', '4000', '52']], formulas: [], colCount: 3 }
    expect(suggestColumns(banded, 0).map(c => c.role)).toEqual(['axis', 'value', 'value'])
    const rates: StoredSheet = { name: 'r', rows: [['age', 'deaths per 1000', 'q_x'], ['60', '5.1', '0.0012'], ['65', '7.9', '0.0019']], formulas: [], colCount: 3 }
    expect(suggestColumns(rates, 0).map(c => c.role)).toEqual(['axis', 'value', 'value'])
    const only: StoredSheet = { name: 'o', rows: [['age', 'exposure'], ['60', '5000'], ['61', '4000']], formulas: [], colCount: 2 }
    expect(suggestColumns(only, 0).map(c => c.role)).toEqual(['axis', 'value'])
  })

  it('are read exactly, sorted with the axis, with deaths of 0 allowed', () => {
    const v = validateMapping(sheet(ROWS), mapping())
    expect(v.findings.map(f => f.code)).toEqual(['unsorted'])
    expect(v.experience).toEqual([{ x: '60', exposure: '1000', deaths: '10' }, { x: '61', exposure: '980.5', deaths: '12' }, { x: '62', exposure: '950', deaths: '0' }])
    expect(validateMapping(sheet(ROWS), mapping({ exposureColumn: 1 })).experience![0]).toEqual({ x: '60', exposure: '1000', deaths: null })
    expect(validateMapping(sheet(ROWS), importMappingSchema.parse({ ...mapping(), experience: undefined })).experience).toBeNull()
  })

  it('name the cell of an exposure that is not more than 0, a percentage, or text, and of negative deaths; blanks are warnings', () => {
    const v = validateMapping(sheet([['60', '0', '1', '0.01'], ['61', '5%', '-1', '0.01'], ['62', 'many', '', '0.01'], ['63', '', '2', '0.01']]), mapping())
    expect(v.findings.map(f => `${f.severity} ${f.code} ${f.cell}`)).toEqual([
      'error experience-invalid B2', 'error experience-invalid B3', 'error experience-invalid C3', 'error not-a-number B4', 'warning deaths-blank C4', 'warning exposure-blank B5',
    ])
  })

  it('are refused in a mapping when deaths come without an exposure, a column is used twice, or the axis holds bands', () => {
    expect(() => mapping({ deathsColumn: 2 })).toThrow()
    expect(() => mapping({ exposureColumn: 3 })).toThrow(/cannot also be the axis or a value column/)
    expect(() => mapping({ exposureColumn: 1, deathsColumn: 1 })).toThrow(/column of its own/)
    expect(() => importMappingSchema.parse({ ...mapping(), bands: { values: 'totals' } })).toThrow(/single ages/)
  })

  it('show in the preview in the sheet\'s column order, not the mapping\'s', () => {
    const p = previewTask({ sheetsJson: JSON.stringify([sheet(ROWS)]), mapping: mapping() })
    expect(p.columns).toEqual([0, 1, 2, 3])
    expect(p.rows.find(r => r.row === 2)!.cells).toEqual(['60', '1000', '10', '0.01'])
  })
})
