import type { Dec, DecimalCtor } from '../decimal'
import type { PiecewisePolynomial } from '../piecewise'
import type { MethodId } from '../types'

export interface OptionDescriptor {
  name: string
  type: 'enum' | 'decimal'
  values?: string[]
  default: string
  description: string
  /** The option is used only when another option has one of these values, e.g. { condition: ['left-slope'] }. */
  appliesWhen?: Record<string, string[]>
}

export interface MethodDefinition {
  id: MethodId
  label: string
  /** Fewest knots accepted (as SciPy for the same method). */
  minPoints: number
  /** Published source of the method. */
  source: string
  summary: string
  options: OptionDescriptor[]
  /** 'log': the method works on ln y by construction (log-linear); the request's transform must then be 'none'. */
  scale?: 'log'
  /** Fit pieces through sorted, distinct x with values y (already on the method's scale). Options are resolved. */
  fit(x: Dec[], y: Dec[], options: Record<string, string>, D: DecimalCtor): PiecewisePolynomial
}
