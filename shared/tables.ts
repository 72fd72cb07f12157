// Table kinds, axes, units and version states, with the names Knotwork shows for them.
import { TABLE_KINDS, type TableKind } from './engine/contract'

export { TABLE_KINDS, type TableKind }
export const KIND_LABELS: Record<TableKind, string> = {
  'mortality': 'Mortality q_x',
  'lapse': 'Lapse rates',
  'salary': 'Salary scale',
  'spot-rate': 'Spot-rate curve',
  'discount-factor': 'Discount factors',
  'other': 'Other',
}

/** How a curve's spot rates compound, in words (curve kinds only). */
export const COMPOUNDING_WORDS: Record<'annual' | 'continuous' | 'semi-annual', string> = {
  'annual': 'Annual compounding',
  'semi-annual': 'Semi-annual compounding',
  'continuous': 'Continuous compounding',
}

export const AXES = ['age', 'policy-year', 'term'] as const
export type Axis = (typeof AXES)[number]
export const AXIS_LABELS: Record<Axis, string> = { 'age': 'Age', 'policy-year': 'Policy year', 'term': 'Term' }

/** A table holds one value per row (one-way) or per row and column (two-way: e.g. age at entry by duration). */
export const SHAPES = ['one-way', 'two-way'] as const
export type Shape = (typeof SHAPES)[number]
/** The column axis of a two-way table: duration since entry (select tables), age (lapse by policy year and age), service. */
export const COL_AXES = ['duration', 'age', 'service'] as const
export type ColAxis = (typeof COL_AXES)[number]
export const COL_AXIS_LABELS: Record<ColAxis, string> = { duration: 'Duration', age: 'Age', service: 'Service' }
/** The heading of the ultimate column, and the word for it in every listing and file. */
export const ULTIMATE_LABEL = 'Ultimate'

export const AXIS_UNITS = ['years', 'months'] as const
export type AxisUnit = (typeof AXIS_UNITS)[number]

export const VALUE_UNITS = ['per-unit', 'percent', 'per-mille', 'basis-points'] as const
export type ValueUnit = (typeof VALUE_UNITS)[number]
export const VALUE_UNIT_LABELS: Record<ValueUnit, string> = { 'per-unit': 'per unit', 'percent': '%', 'per-mille': '‰', 'basis-points': 'bp' }
/** The unit in words, as column headings and axis titles carry it: "q_x (per mille)". */
export const VALUE_UNIT_WORDS: Record<ValueUnit, string> = { 'per-unit': 'per unit', 'percent': '%', 'per-mille': 'per mille', 'basis-points': 'basis points' }
/** Basis points are a unit of rates on a curve; every other unit suits every kind. */
export function unitFitsKind(kind: TableKind, unit: ValueUnit): boolean {
  return unit !== 'basis-points' || kind === 'spot-rate'
}
export const UNIT_KIND_MESSAGE = 'Basis points are for spot-rate curves; choose %, per mille or per unit for this kind of table'

/** What the values of each kind are called in headings (q_x is the trade's own symbol). */
export const VALUE_NAMES: Record<TableKind, string> = {
  'mortality': 'q_x',
  'lapse': 'Lapse rate',
  'salary': 'Salary scale',
  'spot-rate': 'Spot rate',
  'discount-factor': 'Discount factor',
  'other': 'Value',
}

/** "Age (years)", "Term (months)", "Policy year". */
export function axisHeading(axis: Axis, axisUnit: AxisUnit): string {
  return axis === 'policy-year' ? AXIS_LABELS[axis] : `${AXIS_LABELS[axis]} (${axisUnit})`
}

/** "Duration (years)", the ultimate column "Ultimate". */
export function colHeading(colAxis: ColAxis, unit: AxisUnit, d: string | null): string {
  return d === null ? ULTIMATE_LABEL : `${COL_AXIS_LABELS[colAxis]} ${d}${unit === 'months' ? ' m' : ''}`
}

/** "q_x (per mille)", "Spot rate (%)", "Salary scale (per unit)". */
export function valueHeading(kind: TableKind, unit: ValueUnit): string {
  return `${VALUE_NAMES[kind]} (${VALUE_UNIT_WORDS[unit]})`
}

export const VERSION_STATUSES = ['draft', 'in-review', 'approved', 'retired'] as const
export type VersionStatus = (typeof VERSION_STATUSES)[number]
// Our own names for the states a version passes through.
export const STATUS_LABELS: Record<VersionStatus, string> = {
  'draft': 'Working draft',
  'in-review': 'Awaiting second check',
  'approved': 'Signed off',
  'retired': 'Withdrawn',
}
