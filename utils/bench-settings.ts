// The fill bench's settings and methods as the form holds them, and the compare body made from them (pure: no requests).
import type { ExtrapolationRule, MethodId, TransformId } from '#shared/engine/contract'
import { CLOSURE_OPTIONS, DEFAULT_BENCH_METHODS, MAX_BENCH_METHODS, isClosureRule, type ClosureOptionName } from '#shared/fills'
import { offeredMethods } from '#shared/method-scope'
import type { CompareInput, MethodChoice } from '#shared/schemas/fills'
import type { MethodListing, StoredFillSpec } from '#shared/types/fills'
import type { Axis, TableKind } from '#shared/tables'
import { methodWords } from '#shared/fill-words'

/** One method on the bench, with its option values as the form holds them. */
export interface BenchMethod { key: number, method: MethodId, options: Record<string, string> }

export interface BenchSettings {
  grid: { from: string, to: string, step: string }
  transform: TransformId
  extrapolation: ExtrapolationRule
  /** The old-age closure's options as typed (blank: the engine's default). */
  closure: Record<ClosureOptionName, string>
  ages: string
  interest: string
}

let nextKey = 1
export function newBenchMethod(listing: MethodListing): BenchMethod {
  return { key: nextKey++, method: listing.id, options: Object.fromEntries(listing.options.map(o => [o.name, o.default])) }
}

/** A readable name for a method with its non-default options ("Quadratic spline · Straight last piece"). */
export function benchLabel(m: BenchMethod, listing: MethodListing | undefined): string {
  return methodWords(listing, m.method, m.options)
}

/** Defaults from the table: every whole age or policy year between the first and last point; monthly terms for a curve. */
export function defaultSettings(kind: TableKind, axis: Axis, knots: { x: string }[]): BenchSettings {
  const first = knots[0]?.x ?? '0'
  const last = knots.at(-1)?.x ?? '1'
  const step = axis === 'term' ? '1/12' : '1'
  const from = axis === 'term' ? first : String(Math.ceil(Number(first)))
  const to = axis === 'term' ? last : String(Math.floor(Number(last)))
  return { grid: { from, to, step }, transform: 'none', extrapolation: 'error', closure: blankClosure(), ages: kind === 'mortality' ? '65' : '', interest: '0.03' }
}

const blankClosure = () => Object.fromEntries(CLOSURE_OPTIONS.map(o => [o.name, ''])) as Record<ClosureOptionName, string>

/** The usual three, less any the bench does not offer for this table (too few points). */
export function defaultMethods(listings: MethodListing[], kind: TableKind, xs: string[]): BenchMethod[] {
  const offered = offeredMethods(listings, kind, xs)
  return DEFAULT_BENCH_METHODS.map(id => offered.find(l => l.id === id)).filter((l): l is MethodListing => !!l).map(newBenchMethod)
}

/**
 * Reopening a version that has a chosen fill: the bench starts from that fill's grid, transform, edge rule and money
 * settings, and the chosen method (with its options) stands beside the usual three, so the comparison on screen is the
 * one the choice was made from.
 */
export function benchFromSaved(settings: BenchSettings, methods: BenchMethod[], spec: StoredFillSpec | undefined, listings: MethodListing[]): { settings: BenchSettings, methods: BenchMethod[] } {
  if (!spec?.bench) return { settings, methods }
  const money = spec.money?.ages?.length ? { ages: spec.money.ages.join(', '), interest: spec.money.interest } : {}
  const closure = { ...blankClosure(), ...(isClosureRule(spec.extrapolation) ? spec.extrapolationOptions ?? {} : {}) }
  const fromSaved = { ...settings, grid: { ...spec.bench.grid }, transform: spec.transform, extrapolation: spec.extrapolation, closure, ...money }
  const listing = listings.find(l => l.id === spec.method)
  if (!listing) return { settings: fromSaved, methods }
  const chosen = { ...newBenchMethod(listing), options: { ...newBenchMethod(listing).options, ...spec.options } }
  const label = (m: BenchMethod) => benchLabel(m, listings.find(l => l.id === m.method))
  const present = methods.some(m => label(m) === label(chosen))
  return { settings: fromSaved, methods: present || methods.length >= MAX_BENCH_METHODS ? methods : [...methods, chosen] }
}

/** The compare body for the current settings (options that do not apply are left to the engine to drop). */
export function compareBody(settings: BenchSettings, methods: BenchMethod[], listings: MethodListing[], kind: TableKind, baseline: string | null): CompareInput {
  const ages = settings.ages.split(/[\s,;]+/).filter(Boolean).map(Number).filter(n => Number.isInteger(n))
  const choices: MethodChoice[] = methods.map(m => toChoice(m, listings))
  return {
    grid: { ...settings.grid },
    transform: settings.transform,
    extrapolation: settings.extrapolation,
    ...(isClosureRule(settings.extrapolation) ? { extrapolationOptions: closureOptions(settings.closure) } : {}),
    methods: choices,
    ...(baseline && choices.some(c => c.label === baseline) ? { baseline } : {}),
    ...(kind === 'mortality' ? { money: { ...(ages.length ? { ages } : {}), interest: settings.interest } } : {}),
  }
}

/** The closure options that were typed (blank ones are left to the engine's defaults). */
function closureOptions(typed: Record<ClosureOptionName, string>): Partial<Record<ClosureOptionName, string>> {
  return Object.fromEntries(Object.entries(typed).map(([k, v]) => [k, v.trim()]).filter(([, v]) => v !== ''))
}

export function toChoice(m: BenchMethod, listings: MethodListing[]): MethodChoice {
  const listing = listings.find(l => l.id === m.method)
  const options = Object.fromEntries(Object.entries(m.options).filter(([name]) => {
    const o = listing?.options.find(x => x.name === name)
    return o && (!o.appliesWhen || Object.entries(o.appliesWhen).every(([k, v]) => v.includes(m.options[k] ?? '')))
  }))
  return { method: m.method, options, label: benchLabel(m, listing) }
}
