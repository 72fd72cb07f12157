// A fill's settings in words a reviewer reads, the same on the bench, the table page, the version diff, the audit trail
// and the signed workbook: method names, option names and option values come from the engine's listing (label,
// valueLabels), never as ids. Listings are passed in (the server has them from the engine, the client from the API).
import type { Compounding, ExtrapolationRule, MethodListing, OptionDescriptor, TransformListing } from './engine/contract'
import { COMPOUNDING_WORDS } from './tables'
import { EXTRAPOLATION_LABELS } from './fills'
import { fromPerUnit } from './decimal-text'
import { groupThousands } from './plain-text'

export interface WordRow { label: string, value: string }
/** The parts of a stored spec (the engine's resolved spec plus the bench's grid) these words need. */
export interface SpecLike {
  method: string
  options?: Record<string, string>
  transform?: string
  extrapolation?: string
  extrapolationOptions?: Record<string, string> | null
  compounding?: string
  grid?: { from: string, to: string, step: string } | null
  at?: string[] | null
  precision?: number
  engineVersion?: string
  money?: { ages?: number[], interest?: string }
  bench?: { grid?: { from: string, to: string, step: string }, label?: string }
}

const applies = (o: OptionDescriptor, options: Record<string, string>) =>
  !o.appliesWhen || Object.entries(o.appliesWhen).every(([k, v]) => v.includes(options[k] ?? ''))

/** An option's value as a person reads it: the enum's words, or the number as given. */
export function optionValueWords(o: OptionDescriptor, value: string): string {
  return o.valueLabels?.[value] ?? value
}

/** Every option that applies, in words ("Extra condition: Straight last piece", "Start slope: 0.002"). */
export function optionRows(listing: MethodListing | undefined, options: Record<string, string> = {}): WordRow[] {
  if (!listing) return Object.entries(options).map(([k, v]) => ({ label: k, value: v }))
  return listing.options.filter(o => options[o.name] !== undefined && applies(o, options)).map(o => ({ label: o.label, value: optionValueWords(o, options[o.name]!) }))
}

/** "Quadratic spline · Straight last piece": the method with the options that differ from their defaults. */
export function methodWords(listing: MethodListing | undefined, method: string, options: Record<string, string> = {}): string {
  const base = listing?.label ?? method
  const changed = (listing?.options ?? []).filter(o => options[o.name] !== undefined && options[o.name] !== o.default && applies(o, options))
  return changed.length ? `${base} · ${changed.map(o => (o.type === 'enum' ? optionValueWords(o, options[o.name]!) : `${o.label} ${options[o.name]}`)).join(', ')}` : base
}

export function transformWords(transforms: readonly TransformListing[], id: string | undefined): string {
  if (!id || id === 'none') return 'The values themselves'
  return transforms.find(t => t.id === id)?.label ?? id
}

/** The grid a fill was made on: "55 to 110, step 1 (56 points)" or "354 listed points from 0.25 to 30". */
export function gridWords(spec: SpecLike, pointCount?: number): string {
  const g = spec.bench?.grid ?? spec.grid
  const count = pointCount !== undefined ? ` (${groupThousands(pointCount)} points)` : ''
  if (g) return `${g.from} to ${g.to}, step ${g.step}${count}`
  if (spec.at?.length) return `${groupThousands(spec.at.length)} listed points from ${spec.at[0]} to ${spec.at.at(-1)}`
  return '—'
}

/** The old-age closure's settings in words: "Terminal age: 120", "Law fitted to the given ages: 95 to 110". */
export function closureRows(spec: { extrapolation?: string, extrapolationOptions?: Record<string, string> | null }): WordRow[] {
  const o = spec.extrapolationOptions
  if (!o || !spec.extrapolation || !['gompertz', 'kannisto'].includes(spec.extrapolation)) return []
  return [
    { label: 'Terminal age', value: `${o.terminalAge} (q = 1 from there)` },
    { label: 'Law fitted to the given ages', value: `${o.fitFrom} to ${o.fitTo}` },
  ]
}

/**
 * A stored fill spec as rows of words, in the order a reviewer reads them. Part of signed format 2's sheets: a row is
 * only ever added for a setting that older specs do not carry (compounding and the old-age closures came with engine
 * 1.5.0, before any export carried them), so every older export still reads the same.
 */
export function specRows(spec: SpecLike, methods: readonly MethodListing[], transforms: readonly TransformListing[], pointCount?: number): WordRow[] {
  const listing = methods.find(m => m.id === spec.method)
  const rows: WordRow[] = [{ label: 'Method', value: listing?.label ?? spec.method }, ...optionRows(listing, spec.options)]
  rows.push({ label: 'Interpolated on', value: transformWords(transforms, spec.transform) })
  if (spec.extrapolation) rows.push({ label: 'Outside the given points', value: EXTRAPOLATION_LABELS[spec.extrapolation as ExtrapolationRule] ?? spec.extrapolation })
  rows.push(...closureRows(spec))
  if (spec.compounding) rows.push({ label: 'Rates read as', value: COMPOUNDING_WORDS[spec.compounding as Compounding] ?? spec.compounding })
  rows.push({ label: 'Grid', value: gridWords(spec, pointCount) })
  if (spec.precision) rows.push({ label: 'Precision', value: `${spec.precision} significant digits, rounded half to even` })
  if (spec.money?.ages?.length) rows.push({ label: 'Money view', value: `ages ${spec.money.ages.join(', ')}${spec.money.interest ? ` at ${fromPerUnit(spec.money.interest, 'percent')}% interest` : ''}` })
  if (spec.engineVersion) rows.push({ label: 'Engine version', value: spec.engineVersion })
  return rows
}

/** The parts of a stored two-way fill spec (issue 17) these words need. */
export interface GridSpecLike {
  select: { methods: { x: { method: string, options?: Record<string, string> }, d: { method: string, options?: Record<string, string> } }, transform?: string, extrapolation?: string, precision?: number }
  selectPeriod?: number | null
  engineVersion?: string
  bench?: { grid?: { x: { from: string, to: string, step: string }, d: { from: string, to: string, step: string } }, money?: { ages?: number[], interest?: string } }
  ultimate?: unknown
}

/** A two-way fill's settings as rows of words: the method along each axis, the grid of rows and columns, the rest as one-way. */
export function gridSpecRows(spec: GridSpecLike, methods: readonly MethodListing[], transforms: readonly TransformListing[], names: { rows: string, columns: string }): WordRow[] {
  const words = (m: { method: string, options?: Record<string, string> }) => methodWords(methods.find(l => l.id === m.method), m.method, m.options)
  const s = spec.select
  const rows: WordRow[] = [
    { label: `Method along ${names.rows}`, value: words(s.methods.x) },
    { label: `Method along ${names.columns}`, value: words(s.methods.d) },
    { label: 'Ultimate column', value: spec.ultimate ? `filled along ${names.rows} with the same method` : 'none' },
    { label: 'Interpolated on', value: transformWords(transforms, s.transform) },
  ]
  if (s.extrapolation) rows.push({ label: 'Outside the given points', value: EXTRAPOLATION_LABELS[s.extrapolation as ExtrapolationRule] ?? s.extrapolation })
  const g = spec.bench?.grid
  if (g) rows.push({ label: 'Grid', value: `${names.rows} ${g.x.from} to ${g.x.to} step ${g.x.step}; ${names.columns} ${g.d.from} to ${g.d.to} step ${g.d.step}` })
  if (spec.selectPeriod) rows.push({ label: 'Select period', value: `${spec.selectPeriod} years` })
  if (s.precision) rows.push({ label: 'Precision', value: `${s.precision} significant digits, rounded half to even` })
  const money = spec.bench?.money
  if (money?.ages?.length) rows.push({ label: 'Money view', value: `entry ages ${money.ages.join(', ')}${money.interest ? ` at ${fromPerUnit(money.interest, 'percent')}% interest` : ''}` })
  if (spec.engineVersion) rows.push({ label: 'Engine version', value: spec.engineVersion })
  return rows
}
