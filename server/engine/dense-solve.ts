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

/**
 * Solve A u = b for a symmetric positive definite A by the LDL^T factorisation without pivoting (Golub and Van Loan, Matrix
 * Computations, 4th ed., 4.1.2 and 4.2): half the work of elimination. Falls back to solveDense when a pivot is not positive
 * (A not positive definite at this precision).
 */
export function solveSymmetric(A: Dec[][], b: Dec[]): Dec[] {
  const n = b.length
  const L: Dec[][] = A.map(() => [])
  const d: Dec[] = []
  for (let j = 0; j < n; j += 1) {
    // v_k = L_jk d_k; d_j = A_jj - sum_k L_jk v_k; L_ij = (A_ij - sum_k L_ik v_k) / d_j
    const v: Dec[] = []
    let dj = A[j]![j]!
    for (let k = 0; k < j; k += 1) {
      v.push(L[j]![k]!.times(d[k]!))
      dj = dj.minus(L[j]![k]!.times(v[k]!))
    }
    if (!dj.gt(0)) return solveDense(A, b)
    d.push(dj)
    for (let i = j + 1; i < n; i += 1) {
      let s = A[i]![j]!
      for (let k = 0; k < j; k += 1) s = s.minus(L[i]![k]!.times(v[k]!))
      L[i]![j] = s.div(dj)
    }
  }
  // L y = b, then D z = y, then L^T u = z
  const y: Dec[] = []
  for (let i = 0; i < n; i += 1) {
    let s = b[i]!
    for (let k = 0; k < i; k += 1) s = s.minus(L[i]![k]!.times(y[k]!))
    y.push(s)
  }
  const u: Dec[] = new Array<Dec>(n)
  for (let i = n - 1; i >= 0; i -= 1) {
    let s = y[i]!.div(d[i]!)
    for (let k = i + 1; k < n; k += 1) s = s.minus(L[k]![i]!.times(u[k]!))
    u[i] = s
  }
  return u
}
