import { cubicSpline } from '../cubic-spline'
import type { MethodDefinition } from './method'

export const cubicClamped: MethodDefinition = {
  id: 'cubic-clamped',
  label: 'Clamped cubic spline',
  minPoints: 2,
  source: 'Cubic spline with given first derivatives at both ends (de Boor, A Practical Guide to Splines, 2001, ch. IV, "complete" spline; scipy.interpolate.CubicSpline bc_type=((1, s0), (1, s1))).',
  summary: 'Twice continuously differentiable; the end slopes are set by the user (default 0, i.e. flat ends). Wrong end slopes bend the end pieces.',
  options: [
    { name: 'startSlope', label: 'Start slope', type: 'decimal', default: '0', description: 'dy/dx at the first point (on the transformed scale when a transform is chosen).' },
    { name: 'endSlope', label: 'End slope', type: 'decimal', default: '0', description: 'dy/dx at the last point (on the transformed scale when a transform is chosen).' },
  ],
  affine: true,
  fit(x, y, options, D) {
    // s'(x_0) = startSlope, s'(x_n) = endSlope (clamped / complete end conditions; de Boor 2001, ch. IV)
    return cubicSpline(
      x, y,
      { type: 'first-derivative', value: new D(options.startSlope ?? '0') },
      { type: 'first-derivative', value: new D(options.endSlope ?? '0') },
    )
  },
}
