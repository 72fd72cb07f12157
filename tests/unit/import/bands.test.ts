// Band axis values on import: recognised in the forms spreadsheets use, explained, and split into single ages only when the
// person says the values are totals (each band's total kept, added up again exactly); rates are never split as totals.
import { describe, expect, it } from 'vitest'
import Decimal from 'decimal.js'
import { bandMiddle, parseBand } from '#shared/bands'
import { importMappingSchema } from '#shared/schemas/imports'
import { suggestColumns } from '~~/server/lib/import/analyse'
import { validateMapping } from '~~/server/lib/import/validate'
import type { StoredSheet } from '~~/server/lib/import/read-workbook'

describe('band axis values', () => {
  it('reads the usual ways of writing a band as whole years, inclusive', () => {
    for (const text of ['55-59', '55 - 59', '55–59', '55 to 59', '55 TO 59', '[55, 60)', '[55,59]']) expect(parseBand(text), text).toEqual({ from: '55', to: '59' })
    for (const text of ['55', '0.5', '59-55', '55-', 'age 55-59', '[55, 55)', '']) expect(parseBand(text), text).toBeNull()
    expect(bandMiddle({ from: '55', to: '59' })).toBe('57.5')
    expect(bandMiddle({ from: '0', to: '9' })).toBe('5')
  })
})

// Deaths in five-year bands (invented test data: the check is that totals are kept, not the values)
const DEATHS = [['60-64', '120'], ['65-69', '180'], ['70-74', '260'], ['75-79', '390'], ['80-84', '520'], ['85-89', '610']]
const sheet: StoredSheet = { name: 'study', rows: [['Age band', 'Deaths'], ...DEATHS], formulas: [], colCount: 2 }
const mapping = (extra: Record<string, unknown>, kind = 'other') => importMappingSchema.parse({
  sheet: 'study', headerRow: 0, axisColumn: 0, axis: 'age', axisUnit: 'years', columns: [{ index: 1, name: 'Deaths by age', kind, valueUnit: 'per-unit' }], ...extra,
})

describe('import of a band axis', () => {
  it('takes a band column as the axis', () => {
    expect(suggestColumns(sheet, 0).map(c => c.role)).toEqual(['axis', 'value'])
  })

  it('asks whether the values are totals or rates before anything is made (a blocking question)', () => {
    const v = validateMapping(sheet, mapping({}))
    expect(v.findings.map(f => f.code)).toEqual(['bands-unanswered'])
    expect(v.findings[0]!.message).toMatch(/holds bands \(60–64 … 85–89\).*totals for each band .* or rates for the whole band/)
    expect(v.bands).toMatchObject({ count: 6, first: '60–64', last: '85–89', widths: [5], answer: null })
    expect(v.tables[0]!.points).toEqual([])
  })

  it('splits totals into single ages with every band\u2019s total kept, and shows the check', () => {
    for (const split of ['sprague', 'beers', 'karup-king'] as const) {
      const v = validateMapping(sheet, mapping({ bands: { values: 'totals', split } }))
      expect(v.findings.filter(f => f.severity === 'error')).toEqual([])
      const points = v.tables[0]!.points
      expect(points.map(p => p.x)).toEqual(Array.from({ length: 30 }, (_, i) => String(60 + i)))
      for (const [band, total] of DEATHS) {
        const [from, to] = band!.split('-').map(Number)
        const sum = points.filter(p => Number(p.x) >= from! && Number(p.x) <= to!).reduce((s, p) => s.plus(p.y), new Decimal(0))
        expect(sum.eq(total!), `${split} ${band}`).toBe(true)
      }
      expect(v.bands!.checks).toHaveLength(6)
      expect(v.bands!.checks.every(c => c.kept)).toBe(true)
    }
  })

  it('refuses to split totals into a table of probabilities, and keeps rates as one point per band at its middle', () => {
    const asQ = validateMapping(sheet, mapping({ bands: { values: 'totals', split: 'sprague' } }, 'mortality'))
    expect(asQ.findings.map(f => f.code)).toContain('bands-totals-kind')
    const rates: StoredSheet = { ...sheet, rows: [['Age band', 'q'], ['60-64', '0.011'], ['65-69', '0.018'], ['70-74', '0.029']] }
    const v = validateMapping(rates, mapping({ bands: { values: 'rates', split: 'sprague' } }, 'mortality'))
    expect(v.findings).toEqual([])
    expect(v.tables[0]!.points).toEqual([{ x: '62.5', y: '0.011' }, { x: '67.5', y: '0.018' }, { x: '72.5', y: '0.029' }])
  })

  it('refuses a column that mixes bands and single ages', () => {
    const mixed: StoredSheet = { ...sheet, rows: [['Age', 'Deaths'], ['60-64', '120'], ['65', '40'], ['70-74', '260']] }
    expect(validateMapping(mixed, mapping({ bands: { values: 'totals', split: 'karup-king' } })).findings.map(f => f.code)).toContain('bands-mixed')
  })
})
