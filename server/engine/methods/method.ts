import type { Dec, DecimalCtor } from '../decimal'
import type { PiecewisePolynomial } from '../piecewise'
import type { MethodId, MethodListing, OptionDescriptor } from '../types'

export type { OptionDescriptor }

export interface MethodDefinition extends Omit<MethodListing, 'appliesTo'> {
  id: MethodId
  /** Where the method applies (default: every kind, any spacing). */
  appliesTo?: Partial<MethodListing['appliesTo']>
  /** 'log': the method works on ln y by construction (log-linear); the request's transform must then be 'none'. */
  scale?: 'log'
  /** Fit pieces through sorted, distinct x with values y (already on the method's scale). Options are resolved. */
  fit(x: Dec[], y: Dec[], options: Record<string, string>, D: DecimalCtor): PiecewisePolynomial
  /** Notes for the diagnostics about this fill (knots and output points sorted ascending, on the method's x axis). */
  notes?(knots: Dec[], points: Dec[]): string[]
}
