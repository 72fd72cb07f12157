import type { Dec } from './decimal'

/**
 * A tridiagonal system: row i reads lower[i] u[i-1] + diag[i] u[i] + upper[i] u[i+1] = rhs[i]
 * (lower[0] and upper[n-1] are ignored).
 */
export interface TridiagonalSystem {
  lower: Dec[]
  diag: Dec[]
  upper: Dec[]
  rhs: Dec[]
}

/**
 * Solve by the Thomas algorithm, O(n), no pivoting (Thomas 1949; Conte and de Boor, Elementary Numerical Analysis, tridiagonal systems).
 * The systems built here are diagonally dominant except the not-a-knot end rows, whose elimination stays positive
 * (see docs/methods.md). The only linear solver of the engine.
 */
export function solveTridiagonal(system: TridiagonalSystem): Dec[] {
  const { lower, diag, upper, rhs } = system
  const n = diag.length
  const c: Dec[] = new Array<Dec>(n)
  const d: Dec[] = new Array<Dec>(n)
  // Forward elimination: c'_i = c_i / (b_i - a_i c'_{i-1}), d'_i = (d_i - a_i d'_{i-1}) / (b_i - a_i c'_{i-1}) (Thomas 1949).
  let pivot = diag[0]!
  if (pivot.isZero()) throw new Error('Tridiagonal solver: zero pivot in row 1')
  c[0] = n > 1 ? upper[0]!.div(pivot) : pivot.times(0)
  d[0] = rhs[0]!.div(pivot)
  for (let i = 1; i < n; i += 1) {
    pivot = diag[i]!.minus(lower[i]!.times(c[i - 1]!))
    if (pivot.isZero()) throw new Error(`Tridiagonal solver: zero pivot in row ${i + 1}`)
    c[i] = i < n - 1 ? upper[i]!.div(pivot) : pivot.times(0)
    d[i] = rhs[i]!.minus(lower[i]!.times(d[i - 1]!)).div(pivot)
  }
  // Back substitution: u_i = d'_i - c'_i u_{i+1}.
  const u: Dec[] = new Array<Dec>(n)
  u[n - 1] = d[n - 1]!
  for (let i = n - 2; i >= 0; i -= 1) u[i] = d[i]!.minus(c[i]!.times(u[i + 1]!))
  return u
}
