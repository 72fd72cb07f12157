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

export const AXES = ['age', 'policy-year', 'term'] as const
export type Axis = (typeof AXES)[number]
export const AXIS_LABELS: Record<Axis, string> = { 'age': 'Age', 'policy-year': 'Policy year', 'term': 'Term' }

export const AXIS_UNITS = ['years', 'months'] as const
export type AxisUnit = (typeof AXIS_UNITS)[number]

export const VALUE_UNITS = ['per-unit', 'percent', 'per-mille'] as const
export type ValueUnit = (typeof VALUE_UNITS)[number]
export const VALUE_UNIT_LABELS: Record<ValueUnit, string> = { 'per-unit': 'per unit', 'percent': '%', 'per-mille': '‰' }

export const VERSION_STATUSES = ['draft', 'in-review', 'approved', 'retired'] as const
export type VersionStatus = (typeof VERSION_STATUSES)[number]
// Our own names for the states a version passes through.
export const STATUS_LABELS: Record<VersionStatus, string> = {
  'draft': 'Working draft',
  'in-review': 'Awaiting second check',
  'approved': 'Signed off',
  'retired': 'Withdrawn',
}
