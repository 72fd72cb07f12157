import { secants } from '../hermite'
import type { MethodDefinition } from './method'

export const linear: MethodDefinition = {
  id: 'linear',
  label: 'Linear',
  minPoints: 2,
  source: 'Straight lines between neighbouring points (as numpy.interp).',
  summary: 'Passes through every point; keeps monotone data monotone and within the range of neighbouring points; kinks at the knots.',
  options: [],
  affine: true,
  fit(x, y) {
    // s_i(t) = y_i + m_i t, m_i = (y_{i+1} - y_i)/h_i (linear interpolation; numpy.interp)
    const { m } = secants(x, y)
    return { breaks: x, coefs: m.map((slope, i) => [y[i]!, slope]), endValue: y[y.length - 1]! }
  },
}
