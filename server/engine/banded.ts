import type { Dec, DecimalCtor } from './decimal'
import { commonScale, pow10, roundScaled, toScaled } from './exact'
import { residualPrecision } from './precision'

/**
 * A symmetric band matrix of half-bandwidth m: lower[i][k] = A[i][i - k], k = 0..m (k = 0 is the diagonal; entries
 * before row 0 are unused).
 */
export interface SymmetricBand { n: number, m: number, lower: Dec[][] }

/** A = L D L^T with unit lower-triangular L of the same band: l[i][k] = L[i][i - k] (k >= 1), d[i] = D[i][i]. */
export interface BandLDL { n: number, m: number, l: Dec[][], d: Dec[] }

/**
 * Band LDL^T factorisation of a symmetric positive definite matrix, O(n m^2) (Golub and Van Loan, Matrix Computations,
 * 4th ed., 2013, 4.3 band systems and 4.1.2 LDL^T; no pivoting is needed for positive definite A). Returns null at the first
 * pivot that is not positive (A is not positive definite, e.g. too few positive weights).
 */
export function factorBand(A: SymmetricBand): BandLDL | null {
  const { n, m, lower } = A
  const l: Dec[][] = []
  const d: Dec[] = []
  for (let i = 0; i < n; i += 1) {
    const row: Dec[] = new Array<Dec>(m + 1)
    const ld: Dec[] = new Array<Dec>(m + 1) // ld[i - k] = L[i][k] d[k]
    const lo = Math.max(0, i - m)
    // L[i][j] = (A[i][j] - sum_{k<j} L[i][k] d[k] L[j][k]) / d[j]
    for (let j = lo; j < i; j += 1) {
      let v = lower[i]![i - j]!
      for (let k = Math.max(lo, j - m); k < j; k += 1) v = v.minus(ld[i - k]!.times(l[j]![j - k]!))
      row[i - j] = v.div(d[j]!)
      ld[i - j] = row[i - j]!.times(d[j]!)
    }
    // d[i] = A[i][i] - sum_k L[i][k]^2 d[k]
    let di = lower[i]![0]!
    for (let k = lo; k < i; k += 1) di = di.minus(ld[i - k]!.times(row[i - k]!))
    if (!di.gt(0)) return null
    l.push(row)
    d.push(di)
  }
  return { n, m, l, d }
}

/** Solve L D L^T u = b: forward substitution, scaling, back substitution, O(n m). */
export function solveBand(F: BandLDL, b: Dec[]): Dec[] {
  const { n, m, l, d } = F
  const z: Dec[] = new Array<Dec>(n)
  for (let i = 0; i < n; i += 1) {
    let v = b[i]!
    for (let k = Math.max(0, i - m); k < i; k += 1) v = v.minus(l[i]![i - k]!.times(z[k]!))
    z[i] = v
  }
  const u: Dec[] = new Array<Dec>(n)
  for (let i = n - 1; i >= 0; i -= 1) {
    let v = z[i]!.div(d[i]!)
    for (let k = i + 1; k <= Math.min(n - 1, i + m); k += 1) v = v.minus(l[k]![k - i]!.times(u[k]!))
    u[i] = v
  }
  return u
}

/**
 * The residual b - A u, computed exactly on scaled integers (exact.ts) and rounded once to the precision of D; when a value
 * is too long for that, in decimal at twice D's precision (fallback). For iterative refinement.
 */
export function residualBand(A: SymmetricBand, u: Dec[], b: Dec[], D: DecimalCtor): Dec[] {
  const { n, m, lower } = A
  const sa = commonScale(lower.flat())
  const su = commonScale(u)
  const sb = commonScale(b)
  if (sa === null || su === null || sb === null) return residualRounded(A, u, b, D)
  const S = Math.max(sa + su, sb)
  const lift = pow10(S - sa - su)
  const U = u.map(v => toScaled(v, su)!)
  const L = lower.map(row => row.map(v => toScaled(v, sa)!))
  const out: Dec[] = []
  for (let i = 0; i < n; i += 1) {
    let v = 0n
    for (let j = Math.max(0, i - m); j <= Math.min(n - 1, i + m); j += 1) v += (j <= i ? L[i]![i - j]! : L[j]![j - i]!) * U[j]!
    out.push(roundScaled(toScaled(b[i]!, S)! - v * lift, S, D.precision, D))
  }
  return out
}

function residualRounded(A: SymmetricBand, u: Dec[], b: Dec[], D: DecimalCtor): Dec[] {
  const { n, m, lower } = A
  const R = D.clone({ precision: residualPrecision(D.precision) })
  return b.map((bi, i) => {
    let v = new R(bi)
    for (let j = Math.max(0, i - m); j <= Math.min(n - 1, i + m); j += 1) v = v.minus(new R(j <= i ? lower[i]![i - j]! : lower[j]![j - i]!).times(u[j]!))
    return new D(v)
  })
}

/**
 * The entries of Z = A^-1 inside the band, from the factors, O(n m^2): Z_ij = -sum_k L_ki Z_kj (j > i) and
 * Z_ii = 1/d_i - sum_k L_ki Z_ki, from the last row up (Takahashi, Fagan and Chen 1973; Hutchinson and de Hoog 1985, for
 * smoothing splines). Returns the diagonal.
 */
export function inverseDiagonal(F: BandLDL): Dec[] {
  const { n, m, l, d } = F
  // z[i][k] = Z[i][i + k], k = 0..m
  const z: Dec[][] = new Array<Dec[]>(n)
  const at = (i: number, j: number): Dec => (j >= i ? z[i]![j - i]! : z[j]![i - j]!)
  for (let i = n - 1; i >= 0; i -= 1) {
    const row: Dec[] = new Array<Dec>(m + 1)
    z[i] = row
    const hi = Math.min(n - 1, i + m)
    for (let j = hi; j > i; j -= 1) {
      let v = d[i]!.times(0)
      for (let k = i + 1; k <= hi; k += 1) v = v.minus(l[k]![k - i]!.times(at(k, j)))
      row[j - i] = v
    }
    let v = d[i]!.pow(-1)
    for (let k = i + 1; k <= hi; k += 1) v = v.minus(l[k]![k - i]!.times(row[k - i]!))
    row[0] = v
  }
  return z.map(row => row[0]!)
}
