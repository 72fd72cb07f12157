import { cubicSpline } from '../cubic-spline'
import type { MethodDefinition } from './method'

export const cubicNatural: MethodDefinition = {
  id: 'cubic-natural',
  label: 'Natural cubic spline',
  minPoints: 2,
  source: 'Cubic spline with zero second derivative at both ends (de Boor, A Practical Guide to Splines, 2001, ch. IV; scipy.interpolate.CubicSpline bc_type="natural").',
  summary: 'Twice continuously differentiable; of all C2 interpolants it minimises the integral of the squared second derivative. Can overshoot between points and is not local: moving one point moves the whole curve.',
  options: [],
  affine: true,
  fit(x, y, _options, D) {
    const zero = new D(0)
    // s''(x_0) = s''(x_n) = 0 (natural end conditions; de Boor 2001, ch. IV)
    return cubicSpline(x, y, { type: 'second-derivative', value: zero }, { type: 'second-derivative', value: zero })
  },
}
