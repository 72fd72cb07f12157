import type { Axis, AxisUnit, TableKind, ValueUnit } from '#shared/tables'
import { parseNumberText } from '#shared/decimal-text'
import type { ColumnSuggestion } from '#shared/types/tables'
import type { StoredSheet } from './read-workbook'

import { columnLetter } from '#shared/cells'
import { parseBand } from '#shared/bands'

export { cellAddress, columnLetter } from '#shared/cells'

const isNumber = (v: string | null | undefined) => !!v && parseNumberText(v).ok
/** A number, or a band of whole years ("55-59", "[55, 60)"): what an axis cell may hold. */
const isAxisValue = (v: string | null | undefined) => isNumber(v) || parseBand(v) !== null
const filled = (row: (string | null)[] | undefined) => (row ?? []).filter(v => v !== null && v !== '')

/**
 * The header row: the first row (of the first 40) with at least two filled cells, mostly text,
 * followed by a row with at least two numbers. Notes rows above the header are common.
 */
export function proposeHeaderRow(rows: (string | null)[][]): number {
  const limit = Math.min(rows.length, 40)
  for (let r = 0; r < limit; r++) {
    const cells = filled(rows[r])
    if (cells.length < 2 || cells.filter(v => !isAxisValue(v)).length * 2 < cells.length) continue
    let next = r + 1
    while (next < rows.length && filled(rows[next]).length === 0) next++
    if (filled(rows[next]).filter(isAxisValue).length >= 2) return r
  }
  return 0
}

export function guessKind(header: string): TableKind {
  const h = header.toLowerCase()
  if (/q_?x|mort|death|dying/.test(h)) return 'mortality'
  if (/lapse|surrender|persist|withdraw/.test(h)) return 'lapse'
  if (/discount|\bdf\b|p\(t\)/.test(h)) return 'discount-factor'
  if (/spot|zero|yield|curve|\brate\b/.test(h)) return 'spot-rate'
  if (/salar|wage|pay|earning/.test(h)) return 'salary'
  return 'other'
}

export function guessAxis(header: string): { axis: Axis; axisUnit: AxisUnit } {
  const h = header.toLowerCase()
  const axisUnit: AxisUnit = /month/.test(h) ? 'months' : 'years'
  if (/term|tenor|maturity|\bt\b/.test(h)) return { axis: 'term', axisUnit }
  if (/policy|duration|year/.test(h)) return { axis: 'policy-year', axisUnit }
  return { axis: 'age', axisUnit }
}

/** Unit from the header, the cells, and (for probabilities) the size of the values. */
export function guessUnit(header: string, values: string[], kind: TableKind): { unit: ValueUnit; reason: string | null } {
  const h = header.toLowerCase()
  if (/\u2030|per ?mille|permille|per 1,?000|per thousand/.test(h)) return { unit: 'per-mille', reason: 'the header says per mille' }
  if (/%|percent|per cent/.test(h)) return { unit: 'percent', reason: 'the header says percent' }
  if (kind === 'spot-rate' && /\bbps?\b|basis points?/.test(h)) return { unit: 'basis-points', reason: 'the header says basis points' }
  if (values.some(v => v.trim().endsWith('%'))) return { unit: 'percent', reason: 'cells are written with %' }
  if (kind === 'mortality' || kind === 'lapse') {
    const max = Math.max(...values.map(v => parseNumberText(v)).filter(p => p.ok && p.scale === 1).map(p => Number((p as { value: string }).value)))
    if (max > 100) return { unit: 'per-mille', reason: `values up to ${max} suggest per mille for a probability` }
    if (max > 1) return { unit: 'percent', reason: `values up to ${max} suggest percent for a probability` }
  }
  return { unit: 'per-unit', reason: null }
}

export function suggestColumns(sheet: StoredSheet, headerRow: number): ColumnSuggestion[] {
  const header = sheet.rows[headerRow] ?? []
  const body = sheet.rows.slice(headerRow + 1, headerRow + 501)
  const out: ColumnSuggestion[] = []
  let axisTaken = false
  for (let c = 0; c < sheet.colCount; c++) {
    const title = (header[c] ?? '').trim() || `Column ${columnLetter(c)}`
    const values = body.map(r => r[c]).filter((v): v is string => !!v && v.trim() !== '')
    const numeric = values.filter(isNumber).length
    const bands = axisTaken ? 0 : values.filter(v => parseBand(v) !== null).length
    if (values.length && bands * 2 >= values.length) { axisTaken = true; out.push({ index: c, header: title, role: 'axis', kind: 'other', valueUnit: 'per-unit', unitReason: null }); continue }
    if (!values.length || numeric * 2 < values.length) { out.push({ index: c, header: title, role: 'ignore', kind: 'other', valueUnit: 'per-unit', unitReason: null }); continue }
    const isAxis = !axisTaken && (/age|year|term|tenor|duration|maturity|^x$/i.test(title) || c === 0)
    if (isAxis) { axisTaken = true; out.push({ index: c, header: title, role: 'axis', kind: 'other', valueUnit: 'per-unit', unitReason: null }); continue }
    const kind = guessKind(title)
    const { unit, reason } = guessUnit(title, values, kind)
    out.push({ index: c, header: title, role: 'value', kind, valueUnit: unit, unitReason: reason })
  }
  return withExperience(out, sheet, headerRow)
}

/** A heading that names exposures or counts of deaths (not a rate of them: "deaths per 1000" is a rate). */
function experienceRole(header: string): 'exposure' | 'deaths' | null {
  if (/rate|per\s*(1000|mille|cent|unit)|%|‰|q_?x|prob/i.test(header)) return null
  return /expos/i.test(header) ? 'exposure' : /death|claims|decrement/i.test(header) ? 'deaths' : null
}

/**
 * Beside a column of rates by single ages, a column headed as exposures (and one as deaths) is the experience behind
 * them: suggested as such, not as tables of their own. Without rates beside them, or on a band axis (totals to split),
 * they stay values.
 */
function withExperience(out: ColumnSuggestion[], sheet: StoredSheet, headerRow: number): ColumnSuggestion[] {
  const axis = out.find(o => o.role === 'axis')
  const banded = axis && sheet.rows.slice(headerRow + 1, headerRow + 51).some(r => parseBand(r[axis.index] ?? null) !== null)
  const values = out.filter(o => o.role === 'value')
  if (banded || !values.some(o => experienceRole(o.header) === null)) return out
  for (const role of ['exposure', 'deaths'] as const) {
    const first = values.find(o => experienceRole(o.header) === role)
    if (first) Object.assign(first, { role, kind: 'other', valueUnit: 'per-unit', unitReason: null })
  }
  return out
}
