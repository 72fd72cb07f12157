import { EngineError } from './errors'
import type { MethodDefinition } from './methods/method'
import type { ExtrapolationRule, TableKind } from './types'

/** The extrapolation rules a method accepts: 'method' only where it has its own extension; 'flat' and 'linear' not where it requires its own. */
export function extrapolationRules(def: MethodDefinition): ExtrapolationRule[] {
  if (def.extension === 'required') return ['error', 'method']
  return def.extension === 'optional' ? ['error', 'flat', 'linear', 'method'] : ['error', 'flat', 'linear']
}

/** Refuse a table kind or an extrapolation rule the method does not take, saying which it does. */
export function checkApplicability(def: MethodDefinition, kind: TableKind, rule: ExtrapolationRule): void {
  if (def.appliesTo && !def.appliesTo.kinds.includes(kind)) {
    throw new EngineError('not-applicable', `Method ${def.id} fills ${def.appliesTo.kinds.join(' and ')} tables; this table's kind is '${kind}'.`)
  }
  if (extrapolationRules(def).includes(rule)) return
  if (rule === 'method') {
    throw new EngineError('not-applicable', `Method ${def.id} has no extension of its own beyond the knots; choose extrapolation 'error', 'flat' or 'linear'.`)
  }
  throw new EngineError('not-applicable', `Method ${def.id} extends itself beyond the knots; choose extrapolation 'method' to use that extension, or 'error' to keep the points inside the knots ('${rule}' is not offered with it).`)
}

/** What to suggest when a point lies outside the knots under 'error'. */
export function extrapolationAdvice(def: MethodDefinition): string {
  return def.extension === 'required' ? "choose extrapolation 'method' (the method's own extension)" : "choose 'flat' or 'linear' extrapolation"
}
