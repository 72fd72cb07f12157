import { sign, type Dec } from '../decimal'
import { hermitePieces, secants } from '../hermite'
import type { MethodDefinition } from './method'

/** One-sided three-point end slope with shape rules (Moler, Numerical Computing with MATLAB, 2004, 3.6, pchiptx; as SciPy). */
function endSlope(h0: Dec, h1: Dec, m0: Dec, m1: Dec): Dec {
  // d = ((2 h0 + h1) m0 - h0 m1) / (h0 + h1)  (Moler 2004, 3.6)
  const d = h0.times(2).plus(h1).times(m0).minus(h0.times(m1)).div(h0.plus(h1))
  if (sign(d) !== sign(m0)) return d.times(0)
  // if the data turn and |d| > 3 |m0|, cap at 3 m0 (Moler 2004, 3.6)
  if (sign(m0) !== sign(m1) && d.abs().gt(m0.abs().times(3))) return m0.times(3)
  return d
}

/**
 * PCHIP slopes: zero where the secants change sign or one is zero, else the weighted harmonic mean
 * 1/d_k = (w1/m_{k-1} + w2/m_k)/(w1 + w2), w1 = 2h_k + h_{k-1}, w2 = h_k + 2h_{k-1}
 * (Fritsch and Butland 1984, SIAM J. Sci. Stat. Comput. 5(2) 300-304; Fritsch and Carlson 1980; as scipy PchipInterpolator).
 */
export function pchipSlopes(x: Dec[], y: Dec[]): Dec[] {
  const { h, m } = secants(x, y)
  if (x.length === 2) return [m[0]!, m[0]!] // two points: the straight line (SciPy)
  const d: Dec[] = new Array<Dec>(x.length)
  for (let k = 1; k < x.length - 1; k += 1) {
    const a = m[k - 1]!
    const b = m[k]!
    if (sign(a) !== sign(b) || a.isZero() || b.isZero()) {
      d[k] = a.times(0)
      continue
    }
    const w1 = h[k]!.times(2).plus(h[k - 1]!)
    const w2 = h[k]!.plus(h[k - 1]!.times(2))
    // the same mean with one division: (w1 + w2) a b / (w1 b + w2 a)
    d[k] = w1.plus(w2).times(a).times(b).div(w1.times(b).plus(w2.times(a)))
  }
  const n = m.length
  d[0] = endSlope(h[0]!, h[1]!, m[0]!, m[1]!)
  d[x.length - 1] = endSlope(h[n - 1]!, h[n - 2]!, m[n - 1]!, m[n - 2]!)
  return d
}

export const pchip: MethodDefinition = {
  id: 'pchip',
  label: 'Monotone cubic (PCHIP)',
  minPoints: 2,
  source: 'Piecewise cubic Hermite with Fritsch-Butland slopes (Fritsch and Butland 1984; end slopes per Moler, Numerical Computing with MATLAB, 2004, 3.6; as scipy.interpolate.PchipInterpolator).',
  summary: 'Once continuously differentiable; keeps monotone data monotone and never overshoots the neighbouring points; flat where the data turn. Local: a point moves only its neighbourhood.',
  options: [],
  hermiteSlopes: pchipSlopes,
  fit(x, y) {
    return hermitePieces(x, y, pchipSlopes(x, y))
  },
}
