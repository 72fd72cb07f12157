import type { Dec } from './decimal'

/**
 * Solve A u = b (A square, given by rows) by Gaussian elimination with partial pivoting, in the decimal context of A's
 * entries (Golub and Van Loan, Matrix Computations, 4th ed., 3.4, algorithm 3.4.1 with back substitution). O(n^3); for
 * the small dense systems of the curve methods (one row per given term). A and b are not changed.
 */
export function solveDense(A: Dec[][], b: Dec[]): Dec[] {
  const n = b.length
  const M = A.map((row, i) => [...row, b[i]!])
  for (let k = 0; k < n; k += 1) {
    let p = k
    for (let i = k + 1; i < n; i += 1) if (M[i]![k]!.abs().gt(M[p]![k]!.abs())) p = i
    if (M[p]![k]!.isZero()) throw new Error(`Dense solver: the matrix is singular (column ${k + 1})`)
    if (p !== k) [M[p], M[k]] = [M[k]!, M[p]!]
    const pivotRow = M[k]!
    for (let i = k + 1; i < n; i += 1) {
      const row = M[i]!
      const factor = row[k]!.div(pivotRow[k]!)
      if (factor.isZero()) continue
      for (let j = k + 1; j <= n; j += 1) row[j] = row[j]!.minus(factor.times(pivotRow[j]!))
    }
  }
  const u: Dec[] = new Array<Dec>(n)
  for (let i = n - 1; i >= 0; i -= 1) {
    const row = M[i]!
    let s = row[n]!
    for (let j = i + 1; j < n; j += 1) s = s.minus(row[j]!.times(u[j]!))
    u[i] = s.div(row[i]!)
  }
  return u
}
