import { cubicSpline } from '../cubic-spline'
import type { MethodDefinition } from './method'

export const cubicNotAKnot: MethodDefinition = {
  id: 'cubic-not-a-knot',
  label: 'Not-a-knot cubic spline',
  minPoints: 2,
  source: 'Cubic spline whose third derivative is continuous at the second and the next-to-last points (de Boor, A Practical Guide to Splines, 2001, ch. IV; scipy.interpolate.CubicSpline bc_type="not-a-knot").',
  summary: 'Twice continuously differentiable with no arbitrary end condition; the first two and the last two pieces are one cubic each. Two points give the straight line, three points the parabola through them (as SciPy).',
  options: [],
  affine: true,
  fit(x, y) {
    // s''' continuous at x_1 and x_{n-1} (not-a-knot; de Boor 2001, ch. IV)
    return cubicSpline(x, y, { type: 'not-a-knot' }, { type: 'not-a-knot' })
  },
}
