import { roundTo, type Dec, type DecimalCtor } from './decimal'
import { commonScale, pow10, roundScaled, toScaled } from './exact'

/**
 * A fill that is affine in the given values (fixed abscissae in and out): values = c + W y, with c the fill of zeros and
 * column j of W the fill of the j-th unit vector less c (superposition; de Boor, A Practical Guide to Splines, 2001,
 * ch. XVII, where the tensor-product fill is built from such cardinal functions). Returns y -> values rounded to `digits`,
 * each an exact integer dot product rounded once (exact.ts); decimal arithmetic where a number is too long for that.
 */
export function affineFill(fillOf: (y: Dec[]) => Dec[], n: number, D: DecimalCtor, digits: number): (y: Dec[]) => Dec[] {
  const zero = new D(0)
  const c = fillOf(new Array<Dec>(n).fill(zero))
  const W = Array.from({ length: n }, (_, j) => fillOf(Array.from({ length: n }, (__, i) => (i === j ? new D(1) : zero))).map((v, q) => v.minus(c[q]!)))
  const wScale = commonScale([...c, ...W.flat()])
  const cInt = wScale === null ? null : c.map(v => toScaled(v, wScale))
  const wInt = wScale === null ? null : W.map(col => col.map(v => toScaled(v, wScale)))
  const exact = cInt !== null && wInt !== null && cInt.every(v => v !== null) && wInt.every(col => col.every(v => v !== null))
  return (y) => {
    const yScale = exact ? commonScale(y) : null
    const yInt = yScale === null ? null : y.map(v => toScaled(v, yScale))
    if (yScale === null || yInt === null || yInt.some(v => v === null)) {
      return c.map((cq, q) => roundTo(y.reduce((s, yj, j) => s.plus(W[j]![q]!.times(yj)), cq), digits))
    }
    const shift = pow10(yScale)
    return c.map((_, q) => {
      // (c_q + sum_j W_jq y_j) at scale wScale + yScale, exactly
      let acc = (cInt![q] as bigint) * shift
      for (let j = 0; j < n; j += 1) acc += (wInt![j]![q] as bigint) * (yInt[j] as bigint)
      return roundScaled(acc, wScale! + yScale, digits, D)
    })
  }
}
