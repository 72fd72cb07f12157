import { METHODS, TRANSFORM_LISTING, REVIEW_CAUTION } from '~~/server/engine/index'
import type { Diagnostics, MoneyImpact } from '~~/server/engine/types'
import { specRows, type SpecLike, type WordRow } from '#shared/fill-words'
import { checkRows, verdictOf } from '#shared/check-words'
import { fromPerUnit } from '#shared/decimal-text'
import { formatUtc, groupThousands } from '#shared/plain-text'
import type { Compounding } from '#shared/engine/contract'
import { COMPOUNDING_WORDS, KIND_LABELS, STATUS_LABELS, VALUE_NAMES, VALUE_UNIT_WORDS, axisHeading, valueHeading, type Axis, type AxisUnit, type TableKind, type ValueUnit, type VersionStatus } from '#shared/tables'
import type { Pair, Person, SignedContentV2 } from './content'
import { escapeText } from './escape'
import type { CellValue, SheetModel } from './workbook-model'

// The sheets a reviewer reads, from a version's record alone: points in ascending order of the axis with headings that
// name the axis and the unit, values in the table's unit (and per unit beside them when that differs), and an "About"
// sheet in words (the fill's settings, its checks, the money view, the people). The signed workbook of format 2 and the
// unsigned downloads are made of these sheets. What they show is part of format 2: changing any wording here changes the
// cells old files are checked against (tests/unit/export/old-exports.test.ts keeps a format-2 file too).
export const SHEET_V2 = { filled: 'Filled values', given: 'Given points', about: 'About this table', signature: 'Signature' } as const
export type ReadableRecord = Omit<SignedContentV2, 'format' | 'keyId' | 'signedAt'>

export interface Units { kind: TableKind, unit: ValueUnit, axis: Axis, axisUnit: AxisUnit }
export const unitsOf = (r: Pick<ReadableRecord, 'table'>): Units => ({ kind: r.table.kind as TableKind, unit: r.table.valueUnit as ValueUnit, axis: r.table.axis as Axis, axisUnit: r.table.axisUnit as AxisUnit })
/** An axis value as a number when the number reads back exactly, else as its exact text. */
export const axisCell = (x: string): CellValue => (String(Number(x)) === x ? Number(x) : x)

export function pairHeader(u: Units): string[] {
  const value = valueHeading(u.kind, u.unit)
  return [axisHeading(u.axis, u.axisUnit), value, `${value}, every digit`, ...(u.unit === 'per-unit' ? [] : [`${VALUE_NAMES[u.kind]} per unit, every digit`])]
}

export function pairRows(pairs: Pair[], u: Units): CellValue[][] {
  return [pairHeader(u), ...pairs.map(([x, y]): CellValue[] => {
    const shown = fromPerUnit(y, u.unit)
    return [axisCell(x), Number(shown), shown, ...(u.unit === 'per-unit' ? [] : [y])]
  })]
}

export const who = (p: Person | null) => (p ? `${p.name} (${p.email})` : '—')
export const section = (title: string, rows: WordRow[]): CellValue[][] => [[], [title], ...rows.map(r => [r.label, r.value])]

function fillRows(r: ReadableRecord): CellValue[][] {
  const f = r.fill
  if (!f) return section('The fill', [{ label: 'Fill', value: 'No fill was recorded for this version.' }])
  const fitted = f.fittedOn.contentHash === r.version.contentHash
    ? `the given points of this version (content hash ${f.fittedOn.contentHash})`
    : `other points than this version holds (content hash ${f.fittedOn.contentHash ?? 'not recorded'})`
  return section('The fill', [
    ...specRows(f.spec as unknown as SpecLike, METHODS, TRANSFORM_LISTING, f.values.length),
    { label: 'Fitted on', value: fitted },
    { label: 'Reasons for the choice', value: f.rationale || '—' },
    { label: 'Filled by', value: who(f.filledBy) },
    { label: 'Filled at', value: formatUtc(f.filledAt) },
  ])
}

function checkAndMoneyRows(r: ReadableRecord, u: Units): CellValue[][] {
  if (!r.fill) return []
  const d = r.fill.checks as unknown as Diagnostics
  const checks = checkRows(u.kind, u.unit).map((row) => {
    const v = d && typeof d === 'object' ? verdictOf(row, d) : null
    return { label: row.name, value: v ? `${v.good ? 'Fine' : 'Look'}: ${v.text}` : 'Not recorded with this fill.' }
  })
  const money = r.fill.money as unknown as MoneyImpact | null
  const figures = money?.figures?.map(f => ({ label: f.label, value: f.value ?? `not available: ${f.reason ?? 'no reason given'}` })) ?? []
  const title = money?.basis === 'persistency' || money?.basis === 'salary' ? 'What the fill implies' : 'Money view'
  return [...section('Checks of the fill', checks), ...section(title, figures.length ? figures : [{ label: title, value: money?.reason ?? 'None recorded.' }])]
}

/** The "About" sheet: title, banner lines, caution, then the record in words. `extra` ends it (the signing details). */
export function aboutRows(r: ReadableRecord, banner: string[], extra: WordRow[]): CellValue[][] {
  const u = unitsOf(r)
  return [
    [`${r.table.name}, version ${r.version.number} (${r.organisation.name})`],
    ...banner.map(b => [b]),
    [`Caution. ${REVIEW_CAUTION}`],
    ...section('The table', [
      { label: 'Organisation', value: r.organisation.name },
      { label: 'Table', value: r.table.name },
      { label: 'Kind of table', value: KIND_LABELS[u.kind] ?? r.table.kind },
      { label: 'Axis', value: axisHeading(u.axis, u.axisUnit) },
      { label: 'Values in', value: VALUE_UNIT_WORDS[u.unit] ?? r.table.valueUnit },
      ...(r.table.compounding ? [{ label: 'Rates read as', value: COMPOUNDING_WORDS[r.table.compounding as Compounding] ?? r.table.compounding }] : []),
    ]),
    ...section('The version', [
      { label: 'Version', value: String(r.version.number) },
      { label: 'State', value: STATUS_LABELS[r.version.status as VersionStatus] ?? r.version.status },
      { label: 'Notes', value: r.version.notes || '—' },
      { label: 'Given points', value: groupThousands(r.points.length) },
      { label: 'Content hash of the given points', value: r.version.contentHash },
    ]),
    ...fillRows(r),
    ...checkAndMoneyRows(r, u),
    ...peopleRows(r, extra),
  ]
}

/** Who made, submitted and signed off the version, then `extra` (the signing details): the end of every About sheet. */
export function peopleRows(r: Pick<ReadableRecord, 'madeBy' | 'submittedBy' | 'submittedAt' | 'approvedBy' | 'approvedAt'>, extra: WordRow[]): CellValue[][] {
  return section('People', [
    { label: 'Made by', value: who(r.madeBy) },
    { label: 'Submitted for a second check by', value: who(r.submittedBy) },
    { label: 'Submitted at', value: formatUtc(r.submittedAt) },
    { label: 'Signed off by', value: who(r.approvedBy) },
    { label: 'Signed off at', value: formatUtc(r.approvedAt) },
    ...extra,
  ])
}

/** The three readable sheets, text cells escaped against formula injection. */
export function readableSheets(r: ReadableRecord, banner: string[], extra: WordRow[]): SheetModel[] {
  const u = unitsOf(r)
  const wide = u.unit === 'per-unit' ? [16, 22, 48] : [16, 22, 48, 48]
  return escaped([
    { name: SHEET_V2.filled, rows: pairRows(r.fill?.values ?? [], u), widths: wide },
    { name: SHEET_V2.given, rows: pairRows(r.points, u), widths: wide },
    { name: SHEET_V2.about, rows: aboutRows(r, banner, extra), widths: [40, 110] },
  ])
}

export function escaped(sheets: SheetModel[]): SheetModel[] {
  return sheets.map(s => ({ ...s, rows: s.rows.map(row => row.map(v => (typeof v === 'string' ? (v === '' ? null : escapeText(v)) : v))) }))
}
