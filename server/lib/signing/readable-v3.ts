import { METHODS, TRANSFORM_LISTING, REVIEW_CAUTION } from '~~/server/engine/index'
import type { SelectCheck, SelectFillResult } from '~~/server/engine/types'
import { gridSpecRows, type GridSpecLike } from '#shared/fill-words'
import { fromPerUnit } from '#shared/decimal-text'
import { formatUtc, groupThousands } from '#shared/plain-text'
import { AXIS_LABELS, COL_AXIS_LABELS, KIND_LABELS, STATUS_LABELS, ULTIMATE_LABEL, VALUE_NAMES, VALUE_UNIT_WORDS, axisHeading, valueHeading, type ColAxis, type VersionStatus } from '#shared/tables'
import type { SignedContentV3, Triple } from './content'
import { axisCell, escaped, peopleRows, section, unitsOf, who, type Units } from './readable'
import type { CellValue, SheetModel } from './workbook-model'

// The sheets of a two-way table (format 3): the given cells and the filled values as rows of (row value, column value,
// value), the ultimate column's cells marked "Ultimate", and the "About" sheet in words with the two-way fill's
// settings, checks and money. Like readable.ts for format 2, what these sheets show is part of format 3.
export const SHEET_V3 = { filled: 'Filled values', given: 'Given cells', about: 'About this table', signature: 'Signature' } as const
export type ReadableRecordV3 = Omit<SignedContentV3, 'format' | 'keyId' | 'signedAt'>

const colHead = (r: ReadableRecordV3) => `${COL_AXIS_LABELS[r.table.colAxis as ColAxis]} (${r.table.colAxisUnit})`

function tripleRows(triples: Triple[], u: Units, col: string): CellValue[][] {
  const value = valueHeading(u.kind, u.unit)
  const head = [axisHeading(u.axis, u.axisUnit), col, value, `${value}, every digit`, ...(u.unit === 'per-unit' ? [] : [`${VALUE_NAMES[u.kind]} per unit, every digit`])]
  return [head, ...triples.map(([x, d, y]): CellValue[] => {
    const shown = fromPerUnit(y, u.unit)
    return [axisCell(x), d === null ? ULTIMATE_LABEL : axisCell(d), Number(shown), shown, ...(u.unit === 'per-unit' ? [] : [y])]
  })]
}

const CHECK_NAMES: Record<SelectCheck['key'], string> = {
  'select-below-ultimate': 'Select below ultimate', 'rising-with-duration': 'Rising with duration',
  'smooth-rows': 'Smooth down the columns', 'smooth-columns': 'Smooth along the rows', 'select-ratio': 'Select / ultimate ratio',
}

function fillRowsV3(r: ReadableRecordV3): CellValue[][] {
  const f = r.fill
  if (!f) return section('The fill', [{ label: 'Fill', value: 'No fill was recorded for this version.' }])
  const names = { rows: AXIS_LABELS[r.table.axis as keyof typeof AXIS_LABELS].toLowerCase(), columns: COL_AXIS_LABELS[r.table.colAxis as ColAxis].toLowerCase() }
  const fitted = f.fittedOn.contentHash === r.version.contentHash ? `the given cells of this version (content hash ${f.fittedOn.contentHash})` : `other cells than this version holds (content hash ${f.fittedOn.contentHash ?? 'not recorded'})`
  const checks = ((f.checks as unknown as { checks?: SelectCheck[] } | null)?.checks ?? []).map(c => ({ label: CHECK_NAMES[c.key] ?? c.key, value: `${c.passed === true ? 'Fine' : c.passed === false ? 'Look' : 'Not checked'}: ${c.detail}` }))
  const money = f.money as unknown as SelectFillResult['money'] | null
  const figures = (money?.figures ?? []).map(m => ({ label: `Annuity-due, entry age ${m.age}`, value: m.selectAnnuity ? `${m.selectAnnuity} (select then ultimate); ultimate only ${m.ultimateAnnuity ?? 'not available'}` : `not available: ${m.reason ?? 'no reason given'}` }))
  return [
    ...section('The fill', [
      ...gridSpecRows(f.spec as unknown as GridSpecLike, METHODS, TRANSFORM_LISTING, names),
      { label: 'Filled values', value: groupThousands(f.values.length) },
      { label: 'Fitted on', value: fitted },
      { label: 'Reasons for the choice', value: f.rationale || '—' },
      { label: 'Filled by', value: who(f.filledBy) },
      { label: 'Filled at', value: formatUtc(f.filledAt) },
    ]),
    ...section('Checks of the fill', checks.length ? checks : [{ label: 'Checks', value: 'Not recorded with this fill.' }]),
    ...section('Money view', figures.length ? figures : [{ label: 'Money view', value: money?.note ?? 'None recorded.' }]),
  ]
}

export function aboutRowsV3(r: ReadableRecordV3, banner: string[], extra: { label: string, value: string }[]): CellValue[][] {
  const u = unitsOf(r)
  return [
    [`${r.table.name}, version ${r.version.number} (${r.organisation.name})`],
    ...banner.map(b => [b]),
    [`Caution. ${REVIEW_CAUTION}`],
    ...section('The table', [
      { label: 'Organisation', value: r.organisation.name },
      { label: 'Table', value: r.table.name },
      { label: 'Kind of table', value: `${KIND_LABELS[u.kind] ?? r.table.kind}, two-way` },
      { label: 'Rows', value: axisHeading(u.axis, u.axisUnit) },
      { label: 'Columns', value: `${colHead(r)}${r.table.hasUltimate ? `, then an ultimate column` : ''}` },
      { label: 'Values in', value: VALUE_UNIT_WORDS[u.unit] ?? r.table.valueUnit },
    ]),
    ...section('The version', [
      { label: 'Version', value: String(r.version.number) },
      { label: 'State', value: STATUS_LABELS[r.version.status as VersionStatus] ?? r.version.status },
      { label: 'Notes', value: r.version.notes || '—' },
      { label: 'Given cells', value: groupThousands(r.cells.length) },
      { label: 'Content hash of the given cells', value: r.version.contentHash },
    ]),
    ...fillRowsV3(r),
    ...peopleRows(r, extra),
  ]
}

export function readableSheetsV3(r: ReadableRecordV3, banner: string[], extra: { label: string, value: string }[]): SheetModel[] {
  const u = unitsOf(r)
  const wide = u.unit === 'per-unit' ? [16, 18, 22, 48] : [16, 18, 22, 48, 48]
  return escaped([
    { name: SHEET_V3.filled, rows: tripleRows(r.fill?.values ?? [], u, colHead(r)), widths: wide },
    { name: SHEET_V3.given, rows: tripleRows(r.cells, u, colHead(r)), widths: wide },
    { name: SHEET_V3.about, rows: aboutRowsV3(r, banner, extra), widths: [40, 110] },
  ])
}
