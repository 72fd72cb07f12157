import { canonicalDecimal, cmpDecimal } from './decimal-text'
import type { TableKind } from './tables'

export interface RuleFinding { severity: 'error' | 'warning'; message: string }

// Range rules on stored per-unit values (docs/domain.md#glossary): probabilities lie in [0, 1];
// spot rates outside -5%..25% are unusual (common practice), not impossible.
export function checkValue(kind: TableKind, perUnit: string): RuleFinding | null {
  const v = canonicalDecimal(perUnit)
  const below = (b: string) => cmpDecimal(v, b) < 0
  const above = (b: string) => cmpDecimal(v, b) > 0
  switch (kind) {
    case 'mortality':
      return below('0') || above('1') ? { severity: 'error', message: 'a probability q_x must lie between 0 and 1 (0% to 100%)' } : null
    case 'lapse':
      return below('0') || above('1') ? { severity: 'error', message: 'a lapse rate must lie between 0 and 1 (0% to 100%)' } : null
    case 'spot-rate':
      return below('-0.05') || above('0.25') ? { severity: 'warning', message: 'a spot rate outside -5% to 25% is unusual; check the unit' } : null
    case 'discount-factor':
      if (!above('0')) return { severity: 'error', message: 'a discount factor must be above 0' }
      return above('1.5') ? { severity: 'warning', message: 'a discount factor above 1.5 is unusual; check the unit' } : null
    case 'salary':
      return !above('0') ? { severity: 'warning', message: 'a salary scale value is usually above 0' } : null
    default:
      return null
  }
}

export function checkAxis(x: string): RuleFinding | null {
  return cmpDecimal(canonicalDecimal(x), '0') < 0 ? { severity: 'error', message: 'an axis value (age, year or term) cannot be negative' } : null
}
