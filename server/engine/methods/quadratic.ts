import type { Dec } from '../decimal'
import { secants } from '../hermite'
import type { MethodDefinition } from './method'

type Condition = 'left-zero-curvature' | 'right-zero-curvature' | 'left-slope' | 'right-slope'

/**
 * Knot slopes of the C1 quadratic spline: each piece passes through both ends, so (m_i + m_{i+1})/2 = (y_{i+1} - y_i)/h_i,
 * hence m_{i+1} = 2 (y_{i+1} - y_i)/h_i - m_i (Chapra, Applied Numerical Methods, splines chapter, quadratic splines;
 * also make_interp_spline k=2 in SciPy). The extra condition fixes m_0 (forward sweep) or m_n (backward sweep).
 */
export function quadraticSlopes(x: Dec[], y: Dec[], condition: Condition, slope: Dec): Dec[] {
  const { m: secant } = secants(x, y)
  const n = secant.length
  const s: Dec[] = new Array<Dec>(n + 1)
  if (condition === 'left-zero-curvature' || condition === 'left-slope') {
    // zero curvature on the first piece makes it a straight line: m_0 = m_1 = secant_0
    s[0] = condition === 'left-zero-curvature' ? secant[0]! : slope
    for (let i = 0; i < n; i += 1) s[i + 1] = secant[i]!.times(2).minus(s[i]!)
  }
  else {
    s[n] = condition === 'right-zero-curvature' ? secant[n - 1]! : slope
    // backward: m_i = 2 (y_{i+1} - y_i)/h_i - m_{i+1}
    for (let i = n - 1; i >= 0; i -= 1) s[i] = secant[i]!.times(2).minus(s[i + 1]!)
  }
  return s
}

export const quadratic: MethodDefinition = {
  id: 'quadratic',
  label: 'Quadratic spline',
  minPoints: 2,
  source: 'Quadratic spline with one end condition (Chapra, Applied Numerical Methods with MATLAB, splines chapter; equals scipy.interpolate.make_interp_spline k=2 with one derivative condition).',
  summary: 'Passes through every point with a continuous slope. Any error is handed on from piece to piece with alternating sign: the curve zig-zags, and the result depends on which end carries the extra condition.',
  options: [
    {
      name: 'condition',
      label: 'Extra condition',
      type: 'enum',
      values: ['left-zero-curvature', 'right-zero-curvature', 'left-slope', 'right-slope'],
      valueLabels: { 'left-zero-curvature': 'Straight first piece', 'right-zero-curvature': 'Straight last piece', 'left-slope': 'Given start slope', 'right-slope': 'Given end slope' },
      default: 'left-zero-curvature',
      description: 'The extra equation: zero curvature on the first piece (the first piece is a straight line; the textbook choice), on the last piece, or a given slope at the start or the end.',
    },
    {
      name: 'slope',
      label: 'Slope at that end',
      type: 'decimal',
      default: '0',
      description: 'dy/dx at the start (Given start slope) or at the end (Given end slope).',
      appliesWhen: { condition: ['left-slope', 'right-slope'] },
    },
  ],
  affine: true,
  fit(x, y, options, D) {
    const condition = options.condition as Condition
    const s = quadraticSlopes(x, y, condition, new D(options.slope ?? '0'))
    const coefs: Dec[][] = []
    for (let i = 0; i + 1 < x.length; i += 1) {
      const h = x[i + 1]!.minus(x[i]!)
      // s_i(t) = y_i + m_i t + (m_{i+1} - m_i)/(2 h_i) t^2 (the piece's slope runs linearly from m_i to m_{i+1})
      coefs.push([y[i]!, s[i]!, s[i + 1]!.minus(s[i]!).div(h.times(2))])
    }
    return { breaks: x, coefs, endValue: y[y.length - 1]! }
  },
}
