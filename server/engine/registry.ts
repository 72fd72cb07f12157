import { describeFailure, parseDecimal, quote, type DecimalCtor } from './decimal'
import { EngineError } from './errors'
import { extrapolationRules } from './applicability'
import { akima } from './methods/akima'
import { beers } from './methods/beers'
import { karupKing } from './methods/karup-king'
import { sprague } from './methods/sprague'
import { cubicClamped } from './methods/cubic-clamped'
import { cubicNatural } from './methods/cubic-natural'
import { cubicNotAKnot } from './methods/cubic-not-a-knot'
import { linear } from './methods/linear'
import { logLinear } from './methods/log-linear'
import type { MethodDefinition } from './methods/method'
import { monotoneConvex } from './methods/monotone-convex'
import { TABLE_KINDS, type MethodListing } from './types'
import { pchip } from './methods/pchip'
import { quadratic } from './methods/quadratic'
import { smithWilson } from './methods/smith-wilson'

/** Every method, in the order the product lists them. Adding a method: one file in methods/ and one line here. */
const DEFINITIONS: MethodDefinition[] = [
  linear,
  logLinear,
  quadratic,
  cubicNatural,
  cubicClamped,
  cubicNotAKnot,
  pchip,
  akima,
  karupKing,
  sprague,
  beers,
  monotoneConvex,
  smithWilson,
]

const BY_ID = new Map<string, MethodDefinition>(DEFINITIONS.map(d => [d.id, d]))

export type { MethodListing }

export const METHODS: readonly MethodListing[] = DEFINITIONS.map(d => ({
  id: d.id,
  label: d.label,
  minPoints: d.minPoints,
  appliesTo: { kinds: [...(d.appliesTo?.kinds ?? TABLE_KINDS)], spacing: d.appliesTo?.spacing ?? 'any' },
  source: d.source,
  summary: d.summary,
  options: d.options.map(o => ({ ...o })),
  extrapolation: extrapolationRules(d),
}))

export function methodDefinition(id: unknown): MethodDefinition {
  const def = typeof id === 'string' ? BY_ID.get(id) : undefined
  if (!def) {
    throw new EngineError('unknown-method', `Unknown method ${quote(id)}; choose one of ${DEFINITIONS.map(d => d.id).join(', ')}.`)
  }
  return def
}

/**
 * Validate the options of a method and fill in defaults; options that do not apply to the chosen settings are dropped.
 * Decimal options are parsed in the request's working context D (parsing keeps every digit; precision.ts).
 */
export function resolveOptions(def: MethodDefinition, given: unknown, D: DecimalCtor): Record<string, string> {
  if (given !== undefined && given !== null && (typeof given !== 'object' || Array.isArray(given))) {
    throw new EngineError('invalid-option', `Options for ${def.id} must be an object of named values.`)
  }
  const raw = (given ?? {}) as Record<string, unknown>
  const known = new Set(def.options.map(o => o.name))
  for (const name of Object.keys(raw)) {
    if (!known.has(name)) {
      const list = def.options.length ? `it takes ${def.options.map(o => o.name).join(', ')}` : 'it takes none'
      throw new EngineError('invalid-option', `Method ${def.id} has no option '${name}'; ${list}.`)
    }
  }
  const out: Record<string, string> = {}
  for (const opt of def.options) {
    const value = raw[opt.name] ?? opt.default
    if (opt.type === 'enum') {
      if (typeof value !== 'string' || !opt.values?.includes(value)) {
        throw new EngineError('invalid-option', `Option ${opt.name} of ${def.id} is ${quote(value)}; choose one of ${opt.values?.join(', ')}.`)
      }
      out[opt.name] = value
    }
    else if (typeof value === 'string' && opt.keywords?.includes(value)) {
      out[opt.name] = value // a word the method resolves (e.g. 'auto'), in calibrate
    }
    else {
      const parsed = parseDecimal(D, value)
      const words = opt.keywords?.length ? ` (give a decimal string or ${opt.keywords.map(w => `'${w}'`).join(', ')})` : ''
      if (!parsed.ok) throw new EngineError('invalid-option', `Option ${opt.name} of ${def.id}: ${quote(value)} ${describeFailure(parsed.reason)}${words}.`)
      out[opt.name] = parsed.value.toString()
    }
  }
  for (const opt of def.options) {
    if (!opt.appliesWhen) continue
    const applies = Object.entries(opt.appliesWhen).every(([name, values]) => values.includes(out[name] ?? ''))
    if (!applies) delete out[opt.name]
  }
  return out
}
