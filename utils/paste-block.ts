import { parseNumberText } from '#shared/decimal-text'

// Reading a block of numbers pasted into a grid (copied from a spreadsheet, a text file or a web page), and a decimal
// comma typed into one cell. Pure: tests/unit/paste-block.test.ts.

/** One pasted line that holds values: its number as pasted (1-based, blank lines counted) and its cells as point-decimal text. */
export interface PastedLine { line: number, cells: string[] }
export type PasteReading =
  | { ok: true, lines: PastedLine[], width: number, header: boolean, decimalComma: boolean }
  | { ok: false, message: string }

const UNIT = String.raw`\s*(?:%|\u2030|bps?)?`
/** '0,45', '-12,5 %': a comma between digits, the shape a decimal comma takes. */
const COMMA_DECIMAL = new RegExp(String.raw`^[+-]?\d+,\d+${UNIT}$`, 'i')
/** '1,250', '12,345,678': also a number with commas between thousands; leading zeros never start a thousands group. */
const COMMA_THOUSANDS = new RegExp(String.raw`^[+-]?[1-9]\d{0,2}(,\d{3})+${UNIT}$`, 'i')
/** '1.234,5': points between thousands and a decimal comma. */
const POINT_THOUSANDS_COMMA = new RegExp(String.raw`^[+-]?\d{1,3}(\.\d{3})+,\d+${UNIT}$`, 'i')
/** '0.45', '1,234.5': a decimal point. */
const POINT_DECIMAL = new RegExp(String.raw`^[+-]?(\d{1,3}(,\d{3})+|\d*)\.\d+${UNIT}$`, 'i')

/** Which decimal mark a cell shows beyond doubt ('1,250' shows none: it reads as a thousand and more, or as 1.25). */
function markOf(cell: string): 'comma' | 'point' | null {
  const t = cell.trim()
  if (POINT_THOUSANDS_COMMA.test(t) || (COMMA_DECIMAL.test(t) && !COMMA_THOUSANDS.test(t))) return 'comma'
  if (POINT_DECIMAL.test(t)) return 'point'
  return null
}

/** A cell as point-decimal text, read with decimal commas ('1.234,5' -> '1234.5') or as it is. */
function withPoint(cell: string, decimalComma: boolean): string {
  const t = cell.trim()
  if (!decimalComma) return t
  return (POINT_THOUSANDS_COMMA.test(t) ? t.replace(/\./g, '') : t).replace(',', '.')
}

const isNumber = (text: string) => parseNumberText(text).ok
const looksLikeHeading = (text: string) => !isNumber(text) && /\p{L}/u.test(text)
const quoted = (text: string) => `'${text.length > 40 ? `${text.slice(0, 40)}…` : text}'`

/**
 * Reads pasted text: columns split by tabs (as spreadsheets copy), else by ';', else, when that is unambiguous, by
 * commas. Decimal commas are read when the block shows them ('0,45', '65;0,0123'); a block that mixes decimal points and
 * decimal commas, or uses the comma both between columns and as the decimal mark ('65,0,45'), is refused with the reason.
 * The first line is a heading only when its value cell (the last cell that lands in the grid) is not a number and holds
 * a letter. `into` is the column the active cell is in: a one-column block lands there, a wider block from the axis.
 */
export function readPastedBlock(text: string, into: 'axis' | 'value'): PasteReading {
  const raw = text.replace(/\r\n?/g, '\n').split('\n').map((t, i) => ({ line: i + 1, text: t })).filter(l => l.text.trim() !== '')
  if (!raw.length) return { ok: false, message: 'There is nothing to paste: the clipboard holds no text.' }
  const sep = raw.some(l => l.text.includes('\t')) ? '\t' : raw.some(l => l.text.includes(';')) ? ';' : null
  if (sep) return finish(raw.map(l => ({ line: l.line, cells: trimEnd(l.text.split(sep)) })))
  if (!raw.some(l => l.text.includes(','))) return finish(raw.map(l => ({ line: l.line, cells: [l.text.trim()] })))

  // commas and nothing else: one value per line with a decimal comma, or columns split by commas
  const single = finish(raw.map(l => ({ line: l.line, cells: [l.text.trim()] })))
  const splitLines = raw.map(l => ({ line: l.line, cells: l.text.split(',').map(c => c.trim()) }))
  const widths = new Set(splitLines.slice(looksLikeHeading(splitLines[0]!.cells.at(-1) ?? '') ? 1 : 0).map(l => l.cells.length))
  const split = widths.size === 1 && [...widths][0]! <= 2 ? finish(splitLines) : null
  const splitOk = split?.ok && split.width === 2
  if (single.ok && splitOk && into === 'axis') {
    const first = single.lines[0]!
    return { ok: false, message: `Line ${first.line} ${quoted(raw.find(l => l.line === first.line)!.text.trim())} reads either as two columns or as one number with a decimal comma. To paste one value per line, select a cell of the value column first; to paste two columns, put a tab or ';' between them.` }
  }
  if (single.ok) return single
  if (splitOk) return split!
  const both = raw.find(l => (l.text.match(/,/g)?.length ?? 0) >= 2 && l.text.split(',').every(c => /^\s*[+-]?\d+\s*$/.test(c)))
  if (both) return { ok: false, message: `Line ${both.line} ${quoted(both.text.trim())}: the comma seems to stand both between columns and as the decimal mark, so the values cannot be told apart. Nothing was pasted. Copy the cells straight from the spreadsheet (tabs between columns), put ';' between columns, or write decimals with a point.` }
  return single
}

function trimEnd(cells: string[]): string[] {
  const out = cells.map(c => c.trim())
  while (out.length > 1 && out.at(-1) === '') out.pop()
  return out
}

/** Decides the decimal mark of the whole block, drops a heading line, and checks every cell that lands in the grid. */
function finish(lines: { line: number, cells: string[] }[]): PasteReading {
  const width = Math.min(2, Math.max(...lines.map(l => l.cells.length)))
  const header = looksLikeHeading(lines[0]!.cells[Math.min(width, lines[0]!.cells.length) - 1] ?? '')
  const body = header ? lines.slice(1) : lines
  if (!body.length) return { ok: false, message: 'There is nothing to paste: the text holds only a heading line.' }
  const mark = decimalMark(body.map(l => ({ line: l.line, cells: l.cells.slice(0, width) })))
  if (typeof mark === 'string') return { ok: false, message: mark }
  const out: PastedLine[] = []
  for (const l of body) {
    const cells = l.cells.slice(0, width).map(c => withPoint(c, mark.comma))
    for (const [j, c] of cells.entries()) {
      const p = parseNumberText(c)
      if (!p.ok) return { ok: false, message: `Line ${l.line} of the pasted text${width > 1 ? `, column ${j + 1}` : ''}: ${quoted(l.cells[j]!)} ${p.reason}. Nothing was pasted.` }
    }
    out.push({ line: l.line, cells })
  }
  return { ok: true, lines: out, width, header, decimalComma: mark.comma }
}

/** The decimal mark a block shows (points unless some cell shows a decimal comma), or why it cannot be told. */
function decimalMark(lines: PastedLine[]): { comma: boolean } | string {
  let comma: { line: number, cell: string } | null = null
  let point: { line: number, cell: string } | null = null
  for (const l of lines) {
    for (const c of l.cells) {
      const mark = markOf(c)
      if (mark === 'comma') comma ??= { line: l.line, cell: c }
      if (mark === 'point') point ??= { line: l.line, cell: c }
    }
  }
  if (comma && point) return `The text mixes decimal points (line ${point.line}: ${quoted(point.cell)}) and decimal commas (line ${comma.line}: ${quoted(comma.cell)}), so '1,250' or '1.250' could mean either. Nothing was pasted. Use one decimal mark throughout.`
  return { comma: !!comma }
}

/** A block pasted into the matrix of a two-way table: cells split by tabs (or ';'), decimal commas read as for points. */
export function readPastedMatrix(text: string): { ok: true, lines: string[][], decimalComma: boolean } | { ok: false, message: string } {
  const all = text.replace(/\r\n?/g, '\n').split('\n')
  const rows = (all.at(-1) === '' ? all.slice(0, -1) : all).map((t, i) => ({ line: i + 1, text: t }))
  const sep = rows.some(l => l.text.includes('\t')) ? '\t' : ';'
  const lines = rows.map(l => ({ line: l.line, cells: l.text.split(sep).map(c => c.trim()) }))
  const mark = decimalMark(lines)
  if (typeof mark === 'string') return { ok: false, message: mark }
  return { ok: true, lines: lines.map(l => l.cells.map(c => withPoint(c, mark.comma))), decimalComma: mark.comma }
}

/** A number typed into one cell: point-decimal text for the grid, and what was assumed when the comma could mislead. */
export function readTypedNumber(text: string): { text: string, note: string | null } {
  const t = text.trim()
  if (markOf(t) === 'comma') return { text: withPoint(t, true), note: `Read ${t} as ${withPoint(t, true)} (a decimal comma).` }
  if (COMMA_THOUSANDS.test(t)) return { text: t, note: `Read ${t} as ${t.replace(/,/g, '')} (commas between thousands); for a decimal, type a point: ${t.replace(',', '.').replace(/,/g, '')}.` }
  return { text: t, note: null }
}
