// Choices of the fill bench that both the form and the server know. The vocabulary itself (method, transform and
// extrapolation ids) is the engine's contract, shared/engine/contract.ts.
import { CLOSURE_RULES, EXTRAPOLATION_KINDS, EXTRAPOLATION_RULES, type ClosureRule, type ExtrapolationRule, type MethodId, type TableKind } from './engine/contract'

export { EXTRAPOLATION_RULES }

/** Our own words for the extrapolation rules. */
export const EXTRAPOLATION_LABELS: Record<ExtrapolationRule, string> = {
  error: 'Refuse points outside the given range',
  flat: 'Hold the end value flat',
  linear: 'Extend the end piece as a straight line',
  gompertz: 'Close old ages with a fitted Gompertz law (mortality)',
  kannisto: 'Close old ages with a fitted Kannisto law (mortality)',
  method: 'Let the method carry on by its own rule',
}

/** The extrapolation rules offered for a table of this kind (the engine refuses the others). */
export const extrapolationRulesFor = (kind: TableKind): ExtrapolationRule[] => EXTRAPOLATION_RULES.filter(r => EXTRAPOLATION_KINDS[r].includes(kind))
export const isClosureRule = (rule: string): rule is ClosureRule => (CLOSURE_RULES as readonly string[]).includes(rule)

/** The old-age closure's options in words; blank means the engine's default (said in `blank`). */
export const CLOSURE_OPTIONS = [
  { name: 'terminalAge', label: 'Terminal age', blank: '120', description: 'Age at which q reaches 1: the closed table ends here.' },
  { name: 'fitFrom', label: 'Fit the law from age', blank: '15 years below the last given age', description: 'Youngest given age the law is fitted to.' },
  { name: 'fitTo', label: 'Fit the law up to age', blank: 'the last given age', description: 'Oldest given age the law is fitted to.' },
] as const
export type ClosureOptionName = (typeof CLOSURE_OPTIONS)[number]['name']

/** Preselected on the bench: the three methods whose contrast matters most. */
export const DEFAULT_BENCH_METHODS: MethodId[] = ['linear', 'quadratic', 'cubic-natural']
export const MAX_BENCH_METHODS = 8
export const MIN_RATIONALE = 20
/** Most output points a bench grid may have (the engine allows more; the browser has to draw them). */
export const MAX_BENCH_POINTS = 50_000

/** A grid step: a decimal (0.5) or a fraction (1/12, for monthly terms in years). */
export function parseStep(step: string): { num: bigint, den: bigint } | null {
  const fraction = /^(\d+)\/(\d+)$/.exec(step.trim())
  if (fraction) {
    const num = BigInt(fraction[1]!)
    const den = BigInt(fraction[2]!)
    return num > 0n && den > 0n ? { num, den } : null
  }
  const dec = /^(\d+)(?:\.(\d+))?$/.exec(step.trim())
  if (!dec) return null
  const frac = dec[2] ?? ''
  const num = BigInt(dec[1]! + frac)
  return num > 0n ? { num, den: 10n ** BigInt(frac.length) } : null
}

/** How many points from..to (inclusive when reached) at this step; null when the text is not a valid grid. */
export function gridPointCount(from: string, to: string, step: string): number | null {
  const s = parseStep(step)
  const a = Number(from)
  const b = Number(to)
  if (!s || !Number.isFinite(a) || !Number.isFinite(b) || b < a) return null
  return Math.floor(((b - a) * Number(s.den)) / Number(s.num) + 1e-9) + 1
}
