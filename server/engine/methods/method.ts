import type { Dec, DecimalCtor } from '../decimal'
import type { PiecewisePolynomial } from '../piecewise'
import type { MethodId, MethodListing, OptionDescriptor } from '../types'

export type { OptionDescriptor }

export interface MethodDefinition extends Omit<MethodListing, 'appliesTo' | 'extrapolation'> {
  id: MethodId
  /**
   * 'log': the method works on ln y by construction (log-linear); the request's transform must then be 'none'.
   * 'log-discount': a curve method, it works on ln P(t) by construction (curve kinds only, transform 'none'; the
   * spot rates are read under the request's compounding, and the point t = 0, ln P = 0 is part of the curve).
   */
  scale?: 'log' | 'log-discount'
  /** Where the method applies (default: every kind, any spacing). */
  appliesTo?: Partial<MethodListing['appliesTo']>
  /**
   * The method's own extension beyond the knots (extrapolation 'method'): 'optional' accepts it beside the other rules,
   * 'required' accepts only 'method' (or 'error') beyond the knots. Absent: the method has none and 'method' is refused.
   */
  extension?: 'optional' | 'required'
  /**
   * The fitted values are an affine function of the given y at fixed x (every operation on y is a sum or a product by a
   * number that does not depend on y): a two-way fill may then fill a whole axis by one set of weights.
   */
  affine?: true
  /**
   * A cubic Hermite method whose slopes depend on y in a nonlinear way (PCHIP, Akima): its fit is
   * hermitePieces(x, y, hermiteSlopes(x, y)), whose values are affine in the values and slopes together, so a two-way fill
   * may fill many lines of the same abscissae by one set of weights on (y, slopes).
   */
  hermiteSlopes?(x: Dec[], y: Dec[]): Dec[]
  /** Completes options that depend on the data (a calibration) before the fit; the spec records what it returns. */
  calibrate?(x: Dec[], y: Dec[], options: Record<string, string>, D: DecimalCtor): Record<string, string>
  /** Fit pieces through sorted, distinct x with values y (already on the method's scale). Options are resolved. */
  fit(x: Dec[], y: Dec[], options: Record<string, string>, D: DecimalCtor): PiecewisePolynomial
  /** Notes for the diagnostics about this fill (knots and output points sorted ascending, on the method's x axis). */
  notes?(knots: Dec[], points: Dec[]): string[]
}
