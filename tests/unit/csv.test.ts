import { parse } from 'csv-parse/sync'
import { describe, expect, it } from 'vitest'
import { csvText } from '~~/server/lib/csv'

// RFC 4180 as read back by csv-parse (an outside parser), with the formula guard of OWASP's "CSV injection" advice.
describe('CSV', () => {
  it('keeps every digit of numbers, negative ones too, and guards text that a spreadsheet would run', () => {
    const text = csvText([['Age (years)', 'q_x (per mille), every digit'], ['55', '6.100000000000000000000000000000000000001'], ['0.25', '-0.0150'], ['=1+1', '+SUM(A1)'], ['@cmd', '-2+3'], ['a "quoted", text', 'two\nlines']])
    expect(text.startsWith('\uFEFF')).toBe(true)
    const rows = parse(text.slice(1)) as string[][]
    expect(rows[1]).toEqual(['55', '6.100000000000000000000000000000000000001'])
    expect(rows[2]).toEqual(['0.25', '-0.0150'])
    expect(rows[3]).toEqual(['\'=1+1', '\'+SUM(A1)'])
    expect(rows[4]).toEqual(['\'@cmd', '\'-2+3'])
    expect(rows[5]).toEqual(['a "quoted", text', 'two\nlines'])
    expect(text).toContain('\r\n')
  })
})
