// Source: Chapra, Applied Numerical Methods with MATLAB (and Chapra & Canale, Numerical Methods for Engineers), quadratic
// splines worked example: data (3.0, 2.5), (4.5, 1.0), (7.0, 2.5), (9.0, 0.5), first piece a straight line (a1 = 0).
// Published coefficients (from memory): a1 = 0, b1 = -1, c1 = 5.5; a2 = 0.64, b2 = -6.76, c2 = 18.46;
// a3 = -1.6, b3 = 24.6, c3 = -91.3; interpolated f(5) = 0.66. Cross-checked with SciPy
// make_interp_spline(k=2, bc_type=([(2, 0.0)], None)), which gives f(5) = 0.66 (float 0.66000000000000003).
import Decimal from 'decimal.js'
import { describe, expect, it } from 'vitest'
import { fill } from '~~/server/engine'
import { decimalContext } from '~~/server/engine/decimal'
import { quadratic } from '~~/server/engine/methods/quadratic'
import { globalCoefficients } from '~~/server/engine/piecewise'
import { knots } from './helpers'

const data = knots(['3.0', '4.5', '7.0', '9.0'], ['2.5', '1.0', '2.5', '0.5'])

describe('quadratic spline: textbook worked example (source: Chapra, Applied Numerical Methods, quadratic splines; from memory)', () => {
  it('has the published coefficients a_i x^2 + b_i x + c_i', () => {
    const D = decimalContext(50)
    const x = data.map(k => new D(k.x))
    const y = data.map(k => new D(k.y))
    const pp = quadratic.fit(x, y, { condition: 'left-zero-curvature' }, D)
    const published = [['0', '-1', '5.5'], ['0.64', '-6.76', '18.46'], ['-1.6', '24.6', '-91.3']]
    published.forEach(([a, b, c], i) => {
      const [c0, c1, c2] = globalCoefficients(pp, i)
      expect(c2!.toSD(40).eq(new Decimal(a!)), `a${i + 1}`).toBe(true)
      expect(c1!.toSD(40).eq(new Decimal(b!)), `b${i + 1}`).toBe(true)
      expect(c0!.toSD(40).eq(new Decimal(c!)), `c${i + 1}`).toBe(true)
    })
  })

  it('interpolates f(5) = 0.66', () => {
    const r = fill({ knots: data, method: 'quadratic', at: ['5'] })
    expect(r.points[0]!.y).toBe('0.66')
  })

  it('depends on which end carries the extra condition, and zig-zags (docs/methods.md, quadratic spline)', () => {
    const left = fill({ knots: data, method: 'quadratic', at: ['5', '8'] })
    const right = fill({ knots: data, method: 'quadratic', options: { condition: 'right-zero-curvature' }, at: ['5', '8'] })
    expect(left.points[0]!.y).not.toBe(right.points[0]!.y)
    // the second derivative is 2 a_i: 0, +1.28, -3.2 for the left condition: one sign change at x = 7 (zero on the first piece is skipped)
    expect(left.diagnostics.curvatureSignChanges.count).toBe(1)
    expect(left.diagnostics.curvatureSignChanges.at[0]).toEqual({ from: '7', to: '7' })
  })
})
