// The dense solvers behind Smith-Wilson (Golub and Van Loan, Matrix Computations, 4th ed.: Gaussian elimination with
// partial pivoting, 3.4; LDL^T, 4.1-4.2). Check from the definition: b = A u computed exactly, then u recovered.
import { describe, expect, it } from 'vitest'
import { decimalContext, type Dec } from '~~/server/engine/decimal'
import { solveDense, solveSymmetric } from '~~/server/engine/dense-solve'

const D = decimalContext(60)
const times = (A: Dec[][], u: Dec[]) => A.map(row => row.reduce((s, a, j) => s.plus(a.times(u[j]!)), new D(0)))

describe('dense decimal solvers', () => {
  // the Hilbert matrix 1/(i + j + 1): symmetric positive definite and badly conditioned (about 1e10 at n = 8)
  const n = 8
  const H = Array.from({ length: n }, (_, i) => Array.from({ length: n }, (__, j) => new D(1).div(i + j + 1)))
  const u = Array.from({ length: n }, (_, i) => new D(i + 1).div(7).minus(0.5))
  it('recover u from b = A u on a Hilbert matrix (symmetric and general), to about 60 - 10 digits', () => {
    const b = times(H, u)
    for (const solve of [solveSymmetric, solveDense]) {
      solve(H, b).forEach((v, i) => expect(v.minus(u[i]!).abs().lt('1e-45'), `${solve.name} u_${i}`).toBe(true))
    }
  })
  it('the symmetric solver hands an indefinite matrix to elimination with pivoting; a singular one is refused', () => {
    const A = [[new D(0), new D(1)], [new D(1), new D(0)]]
    expect(solveSymmetric(A, [new D(2), new D(3)]).map(v => v.toString())).toEqual(['3', '2'])
    expect(() => solveDense([[new D(1), new D(2)], [new D(2), new D(4)]], [new D(1), new D(1)])).toThrow('singular')
  })
})
