import type { Dec } from '../decimal'
import { hermitePieces, secants } from '../hermite'
import type { MethodDefinition } from './method'

/** Relative cut-off below which Akima's weights count as zero (SciPy Akima1DInterpolator, break_mult = 1e-9). */
const BREAK_MULT = '1e-9'

/**
 * Akima slopes: t_i = (|m_{i+1} - m_i| m_{i-1} + |m_{i-1} - m_{i-2}| m_i) / (|m_{i+1} - m_i| + |m_{i-1} - m_{i-2}|),
 * and when both weights vanish (m_{i-2} = m_{i-1}, m_i = m_{i+1}) SciPy's fill value (m_{i-2} + m_{i+1})/2, which then equals
 * Akima's (m_{i-1} + m_i)/2 (Akima 1970, J. ACM 17(4) 589-602; as scipy Akima1DInterpolator method='akima').
 */
export function akimaSlopes(x: Dec[], y: Dec[]): Dec[] {
  const { m: secant } = secants(x, y)
  if (x.length === 2) return [secant[0]!, secant[0]!] // two points: the straight line (SciPy)
  const n = secant.length
  // m[2..n+1] are the secants; two extra slopes at each end by linear extrapolation of the slopes (Akima 1970, end points)
  const m: Dec[] = new Array<Dec>(n + 4)
  for (let i = 0; i < n; i += 1) m[i + 2] = secant[i]!
  m[1] = m[2]!.times(2).minus(m[3]!)
  m[0] = m[1]!.times(2).minus(m[2]!)
  m[n + 2] = m[n + 1]!.times(2).minus(m[n]!)
  m[n + 3] = m[n + 2]!.times(2).minus(m[n + 1]!)
  const dm: Dec[] = []
  for (let i = 0; i + 1 < m.length; i += 1) dm.push(m[i + 1]!.minus(m[i]!).abs())
  const f1: Dec[] = []
  const f2: Dec[] = []
  const f12: Dec[] = []
  let fmax = dm[0]!.times(0)
  for (let i = 0; i <= n; i += 1) {
    f1.push(dm[i + 2]!)
    f2.push(dm[i]!)
    f12.push(dm[i + 2]!.plus(dm[i]!))
    if (f12[i]!.gt(fmax)) fmax = f12[i]!
  }
  const cut = fmax.times(BREAK_MULT)
  const t: Dec[] = []
  for (let i = 0; i <= n; i += 1) {
    if (f12[i]!.gt(cut)) t.push(m[i + 1]!.plus(f2[i]!.div(f12[i]!).times(m[i + 2]!.minus(m[i + 1]!))))
    else t.push(m[i + 3]!.plus(m[i]!).div(2)) // (m_{i-2} + m_{i+1})/2: SciPy's fill value where the weights vanish
  }
  return t
}

export const akima: MethodDefinition = {
  id: 'akima',
  label: 'Akima',
  minPoints: 2,
  source: 'Akima (1970), "A new method of interpolation and smooth curve fitting based on local procedures", J. ACM 17(4) 589-602; as scipy.interpolate.Akima1DInterpolator (method="akima").',
  summary: 'Once continuously differentiable and local (each slope uses five points); resists overshoot near steps but does not guarantee monotonicity.',
  options: [],
  hermiteSlopes: akimaSlopes,
  fit(x, y) {
    return hermitePieces(x, y, akimaSlopes(x, y))
  },
}
