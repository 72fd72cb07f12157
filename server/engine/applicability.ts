import { EngineError } from './errors'
import type { MethodDefinition } from './methods/method'
import { CLOSURE_RULES, EXTRAPOLATION_KINDS, type ExtrapolationRule, type TableKind } from './types'

/**
 * The extrapolation rules a method accepts: 'method' only where it has its own extension; 'flat', 'linear' and the
 * old-age closures (gompertz, kannisto: a law above the last age, whatever the method; mortality only, EXTRAPOLATION_KINDS)
 * not where it requires its own.
 */
export function extrapolationRules(def: MethodDefinition): ExtrapolationRule[] {
  if (def.extension === 'required') return ['error', 'method']
  const common: ExtrapolationRule[] = ['error', 'flat', 'linear', ...CLOSURE_RULES]
  return def.extension === 'optional' ? [...common, 'method'] : common
}

/** Refuse a table kind or an extrapolation rule the method does not take, saying which it does. */
export function checkApplicability(def: MethodDefinition, kind: TableKind, rule: ExtrapolationRule): void {
  const kinds = def.appliesTo?.kinds
  if (kinds && !kinds.includes(kind)) {
    throw new EngineError('not-applicable', `Method ${def.id} fills ${kinds.join(' and ')} tables; this table's kind is '${kind}'.`)
  }
  if (extrapolationRules(def).includes(rule)) return
  if (rule === 'method') {
    const offered = extrapolationRules(def).filter(r => EXTRAPOLATION_KINDS[r].includes(kind)).map(r => `'${r}'`)
    throw new EngineError('not-applicable', `Method ${def.id} has no extension of its own beyond the knots; choose extrapolation ${offered.slice(0, -1).join(', ')} or ${offered.at(-1)!}.`)
  }
  throw new EngineError('not-applicable', `Method ${def.id} extends itself beyond the knots; choose extrapolation 'method' to use that extension, or 'error' to keep the points inside the knots ('${rule}' is not offered with it).`)
}

/** What to suggest when a point lies outside the knots under 'error'. */
export function extrapolationAdvice(def: MethodDefinition): string {
  return def.extension === 'required' ? "choose extrapolation 'method' (the method's own extension)" : "choose 'flat' or 'linear' extrapolation"
}
