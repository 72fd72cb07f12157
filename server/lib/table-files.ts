import { REVIEW_CAUTION, METHODS, TRANSFORM_LISTING } from '../engine/index'
import type { CompareResult } from '../engine/types'
import { cmpDecimal, fromPerUnit } from '#shared/decimal-text'
import { specRows, type SpecLike } from '#shared/fill-words'
import { checkRows, verdictOf } from '#shared/check-words'
import { COL_AXIS_LABELS, ULTIMATE_LABEL, VALUE_NAMES, axisHeading, valueHeading, type Axis, type AxisUnit, type ColAxis, type TableKind, type ValueUnit } from '#shared/tables'
import { csvText, type CsvCell } from './csv'
import { SHEET_V2, escaped, readableSheets, type ReadableRecord } from './signing/readable'
import type { CellValue, SheetModel } from './signing/workbook-model'
import type { ReadableRecordV3 } from './signing/readable-v3'
import type { Triple } from './signing/content'

// Unsigned working files: a version's chosen fill, and a comparison on the fill bench, as CSV and .xlsx. Every file says
// in its first line (and its sheet names) that it is not signed off; values keep every digit, in the table's unit.
export interface TableUnits { kind: TableKind, unit: ValueUnit, axis: Axis, axisUnit: AxisUnit }
export const NOT_SIGNED = 'not signed off'
const CAUTION = `Caution. ${REVIEW_CAUTION}`
export const unitsOfRecord = (r: ReadableRecord): TableUnits => ({ kind: r.table.kind as TableKind, unit: r.table.valueUnit as ValueUnit, axis: r.table.axis as Axis, axisUnit: r.table.axisUnit as AxisUnit })

/** The fill's values (or the given points when there is no fill) with every digit, given points marked. */
export function fillCsv(r: ReadableRecord, banner: string): string {
  const u = unitsOfRecord(r)
  const given = new Set(r.points.map(p => p[0]))
  const perUnit = u.unit !== 'per-unit'
  const header = [axisHeading(u.axis, u.axisUnit), `${valueHeading(u.kind, u.unit)}, every digit`, ...(perUnit ? [`${VALUE_NAMES[u.kind]} per unit, every digit`] : []), 'Given point']
  const pairs = r.fill?.values ?? r.points
  const rows = pairs.map(([x, y]): CsvCell[] => [x, fromPerUnit(y, u.unit), ...(perUnit ? [y] : []), given.has(x) ? 'given' : null])
  return csvText([[banner], [CAUTION], [], header, ...rows])
}

/**
 * A two-way version as CSV: one matrix of the fill's values (or the given cells when there is no fill), rows down and
 * columns across (the ultimate column last), every digit in the table's unit; then the given cells as a matrix of their
 * own, blank where a cell was to be filled.
 */
export function gridCsv(r: ReadableRecordV3, banner: string): string {
  const unit = r.table.valueUnit as ValueUnit
  const matrix = (title: string, triples: Triple[]): CsvCell[][] => {
    const xs = [...new Set(triples.map(t => t[0]))]
    const ds = [...new Set(triples.map(t => t[1]))]
    // triples are sorted by row, then column (ultimate last); the columns of the first rows may be fewer than later ones
    ds.sort((a, b) => (a === null ? 1 : b === null ? -1 : cmpDecimal(a, b)))
    const at = new Map(triples.map(([x, d, y]) => [`${x}|${d}`, y]))
    const corner = `${axisHeading(r.table.axis as Axis, r.table.axisUnit as AxisUnit)} down, ${COL_AXIS_LABELS[r.table.colAxis as ColAxis].toLowerCase()} (${r.table.colAxisUnit}) across`
    return [[title], [corner, ...ds.map(d => (d === null ? ULTIMATE_LABEL : d))],
      ...xs.map((x): CsvCell[] => [x, ...ds.map((d) => { const y = at.get(`${x}|${d}`); return y === undefined ? null : fromPerUnit(y, unit) })])]
  }
  const value = valueHeading(r.table.kind as TableKind, unit)
  return csvText([[banner], [CAUTION], [`${value}, every digit`], [],
    ...(r.fill ? [...matrix('Filled values', r.fill.values), []] : []),
    ...matrix(r.fill ? 'Given cells (blank: filled above)' : 'Given cells (blank: to be filled)', r.cells)])
}

// Excel allows 31 characters in a sheet name: "About this table, not signed off" would lose its last letter
const UNSIGNED_SHEET: Partial<Record<string, string>> = { [SHEET_V2.about]: 'About this copy' }

/** The readable sheets of the version (as the signed workbook has them), renamed and headed "not signed off". */
export function fillSheets(r: ReadableRecord, banner: string): SheetModel[] {
  return readableSheets(r, [banner], []).map(s => ({ ...s, name: `${UNSIGNED_SHEET[s.name] ?? s.name}, ${NOT_SIGNED}` }))
}

interface Compared { labels: string[], xs: string[], columns: string[][], knots: Set<string> }
function compared(result: CompareResult, knots: { x: string }[], unit: ValueUnit): Compared {
  const done = result.entries.filter(e => e.ok)
  const xs = done[0]?.ok ? done[0].result.points.map(p => p.x) : []
  return {
    labels: done.map(e => e.label), xs, knots: new Set(knots.map(k => k.x)),
    columns: done.map(e => (e.ok ? e.result.points.map(p => fromPerUnit(p.y, unit)) : [])),
  }
}

/** A bench comparison: one column per method, every digit, in the table's unit. */
export function compareCsv(result: CompareResult, knots: { x: string }[], u: TableUnits, banner: string, settings: string): string {
  const c = compared(result, knots, u.unit)
  const header = [axisHeading(u.axis, u.axisUnit), ...c.labels.map(l => `${l}: ${valueHeading(u.kind, u.unit)}`), 'Given point']
  const rows = c.xs.map((x, k): CsvCell[] => [x, ...c.columns.map(col => col[k]!), c.knots.has(x) ? 'given' : null])
  return csvText([[banner], [CAUTION], [settings], [], header, ...rows])
}

/** The comparison as sheets: numbers to calculate with, every digit as text, and each method's settings and checks. */
export function compareSheets(result: CompareResult, knots: { x: string }[], u: TableUnits, banner: string, settings: string): SheetModel[] {
  const c = compared(result, knots, u.unit)
  const head = [axisHeading(u.axis, u.axisUnit), ...c.labels.map(l => `${l}: ${valueHeading(u.kind, u.unit)}`)]
  const numbers: CellValue[][] = [[banner], [CAUTION], [], head, ...c.xs.map((x, k) => [Number(x), ...c.columns.map(col => Number(col[k]))])]
  const digits: CellValue[][] = [[banner], [], head, ...c.xs.map((x, k) => [x, ...c.columns.map(col => col[k]!)])]
  const about: CellValue[][] = [[banner], [CAUTION], [settings]]
  for (const e of result.entries) {
    about.push([], [e.label])
    if (!e.ok) { about.push(['Could not fill this grid', e.error]); continue }
    for (const row of specRows(e.result.spec as unknown as SpecLike, METHODS, TRANSFORM_LISTING, e.result.points.length)) about.push([row.label, row.value])
    for (const check of checkRows(u.kind, u.unit)) {
      const v = verdictOf(check, e.result.diagnostics)
      about.push([check.name, v ? `${v.good ? 'Fine' : 'Look'}: ${v.text}` : '—'])
    }
    for (const f of e.result.money.figures) about.push([f.label, f.value ?? `not available: ${f.reason ?? ''}`])
  }
  const widths = [16, ...c.labels.map(() => 30)]
  return escaped([
    { name: `Comparison, ${NOT_SIGNED}`, rows: numbers, widths },
    { name: `Every digit, ${NOT_SIGNED}`, rows: digits, widths: [16, ...c.labels.map(() => 48)] },
    { name: `Methods, ${NOT_SIGNED}`, rows: about, widths: [40, 110] },
  ])
}
