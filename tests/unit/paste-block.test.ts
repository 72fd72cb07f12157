import { describe, expect, it } from 'vitest'
import { readPastedBlock, readPastedMatrix, readTypedNumber } from '~~/utils/paste-block'

const cells = (r: ReturnType<typeof readPastedBlock>) => (r.ok ? r.lines.map(l => l.cells) : r.message)
const lineNumbers = (r: ReturnType<typeof readPastedBlock>) => (r.ok ? r.lines.map(l => l.line) : [])

describe('readPastedBlock: headings', () => {
  it('keeps a first line whose value is a number with a decimal comma (was dropped as a heading)', () => {
    const r = readPastedBlock('0,45\n0,69', 'value')
    expect(r).toMatchObject({ ok: true, header: false, decimalComma: true, width: 1 })
    expect(cells(r)).toEqual([['0.45'], ['0.69']])
  })
  it('drops a first line whose value cell is words', () => {
    const r = readPastedBlock('Age\tq_x (per mille)\n65\t1.2\n66\t1.3\n', 'axis')
    expect(r).toMatchObject({ ok: true, header: true, width: 2 })
    expect(cells(r)).toEqual([['65', '1.2'], ['66', '1.3']])
    expect(lineNumbers(r)).toEqual([2, 3])
  })
  it('keeps a first line whose value cell is a number even when its axis cell is not', () => {
    const r = readPastedBlock('Age\t0.5\n66\t0.6', 'axis')
    expect(r).toMatchObject({ ok: false, message: expect.stringContaining("Line 1 of the pasted text, column 1: 'Age' is not a number") })
  })
  it('does not take a mistyped first value for a heading: the error names line 1', () => {
    expect(readPastedBlock('0.4.5\n0.6', 'value')).toMatchObject({ ok: false, message: expect.stringContaining("Line 1 of the pasted text: '0.4.5' is not a number") })
  })
})

describe('readPastedBlock: line numbers as pasted', () => {
  it('counts blank lines and the heading line', () => {
    const r = readPastedBlock('Age\tRate\n65\t0.1\n\n67\tabc\n', 'axis')
    expect(r).toMatchObject({ ok: false, message: expect.stringContaining("Line 4 of the pasted text, column 2: 'abc' is not a number. Nothing was pasted.") })
  })
  it('names the first bad line of a one-column paste', () => {
    expect(readPastedBlock('0.1\n0.2\nx', 'value')).toMatchObject({ ok: false, message: expect.stringMatching(/^Line 3 of the pasted text: 'x' is not a number/) })
  })
})

describe('readPastedBlock: decimal commas', () => {
  it('reads one value per line with a decimal comma', () => {
    expect(cells(readPastedBlock('0,45\r\n0,69\r\n1,5 %', 'value'))).toEqual([['0.45'], ['0.69'], ['1.5 %']])
  })
  it('reads semicolon- and tab-separated columns with decimal commas', () => {
    expect(cells(readPastedBlock('65;0,0123\n66;0,0134', 'axis'))).toEqual([['65', '0.0123'], ['66', '0.0134']])
    expect(cells(readPastedBlock('65\t0,0123\n66\t1.234,5', 'axis'))).toEqual([['65', '0.0123'], ['66', '1234.5']])
  })
  it('reads 1,250 as twelve hundred and fifty unless the block shows decimal commas', () => {
    expect(cells(readPastedBlock('1,250\n2,500', 'value'))).toEqual([['1,250'], ['2,500']])
    expect(cells(readPastedBlock('1,250\n0,5', 'value'))).toEqual([['1.250'], ['0.5']])
  })
  it('reads columns split by commas when the decimals are points', () => {
    expect(cells(readPastedBlock('Age,q\n65,0.45\n66,0.5', 'axis'))).toEqual([['65', '0.45'], ['66', '0.5']])
  })
  it('refuses a comma that stands both between columns and as the decimal mark, and says what to do', () => {
    const r = readPastedBlock('65,0,45\n66,0,5', 'axis')
    expect(r).toMatchObject({ ok: false, message: expect.stringContaining("Line 1 '65,0,45': the comma seems to stand both between columns and as the decimal mark") })
    expect((r as { message: string }).message).toContain("put ';' between columns")
  })
  it('refuses one value per line or two columns when the axis column is the target and either could be meant', () => {
    expect(readPastedBlock('0,45\n0,69', 'axis')).toMatchObject({ ok: false, message: expect.stringContaining('reads either as two columns or as one number with a decimal comma') })
  })
  it('refuses a block that mixes decimal points and decimal commas', () => {
    expect(readPastedBlock('65\t0.5\n66\t0,6', 'axis')).toMatchObject({ ok: false, message: expect.stringContaining("mixes decimal points (line 1: '0.5') and decimal commas (line 2: '0,6')") })
  })
  it('says when there is nothing to paste', () => {
    expect(readPastedBlock('\n \n', 'value').ok).toBe(false)
    expect(readPastedBlock('Age\tRate\n', 'axis')).toMatchObject({ ok: false, message: expect.stringContaining('only a heading') })
  })
})

describe('readTypedNumber', () => {
  it('reads an unambiguous decimal comma and says so', () => {
    expect(readTypedNumber(' 0,45 ')).toEqual({ text: '0.45', note: 'Read 0,45 as 0.45 (a decimal comma).' })
    expect(readTypedNumber('0,450')).toMatchObject({ text: '0.450' })
  })
  it('reads 1,250 as thousands and says how to type the decimal', () => {
    expect(readTypedNumber('1,250')).toEqual({ text: '1,250', note: 'Read 1,250 as 1250 (commas between thousands); for a decimal, type a point: 1.250.' })
  })
  it('leaves other text alone', () => {
    expect(readTypedNumber('1.5%')).toEqual({ text: '1.5%', note: null })
  })
})

describe('readPastedMatrix', () => {
  it('splits by tabs and reads decimal commas over the whole block', () => {
    expect(readPastedMatrix('0,45\t0,5\n\t1,250\n')).toEqual({ ok: true, lines: [['0.45', '0.5'], ['', '1.250']], decimalComma: true })
    expect(readPastedMatrix('1,250\t2')).toEqual({ ok: true, lines: [['1,250', '2']], decimalComma: false })
  })
  it('refuses a block that mixes decimal marks', () => {
    expect(readPastedMatrix('0.5\t0,6')).toMatchObject({ ok: false, message: expect.stringContaining('mixes decimal points') })
  })
})
