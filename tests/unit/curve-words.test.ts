// Smith-Wilson's calibrated alpha and convergence check in the words the bench shows, read from the engine's own report.
// The curve is the engine test's (tests/unit/engine/smith-wilson.test.ts), whose alpha 0.086621 an independent NumPy
// search also finds (curve-reference.test.ts).
import { describe, expect, it } from 'vitest'
import { fill, type FillRequest } from '~~/server/engine/index'
import { convergenceVerdict } from '#shared/check-words'

const TERMS = ['1', '2', '3', '4', '5', '6', '7', '8', '9', '10', '12', '15', '20']
const RATES = ['0.029', '0.03', '0.0305', '0.031', '0.0315', '0.032', '0.0322', '0.0325', '0.0328', '0.033', '0.0333', '0.0335', '0.033']
const BASE: FillRequest = { knots: TERMS.map((x, i) => ({ x, y: RATES[i]! })), method: 'smith-wilson', options: { ufr: '0.0345' }, kind: 'spot-rate', extrapolation: 'method', at: ['1', '60'] }

describe('convergence in words', () => {
  it('says the calibrated alpha, the gap at the convergence point, and why no smaller alpha passes', () => {
    const r = fill(BASE)
    const v = convergenceVerdict(r.diagnostics.convergence!, true)
    expect(v.good).toBe(true)
    expect(v.text).toBe('Alpha 0.086621, calibrated: the smallest alpha of at least 0.05 for which the forward at the convergence point comes within 1 bp of the ultimate forward rate. At 60 years (the convergence point) the forward intensity is 3.3818 % against the ultimate 3.3918 % (ln(1 + UFR)): 0.999973 bp apart, within the 1 bp allowed. One step lower, alpha 0.08662 would leave 1.00001 bp, outside the limit: no smaller alpha passes.')
  })

  it('says when a given alpha misses the check', () => {
    const r = fill({ ...BASE, options: { ufr: '0.0345', alpha: '0.05' } })
    const v = convergenceVerdict(r.diagnostics.convergence!, false)
    expect(v.good).toBe(false)
    expect(v.text).toMatch(/^Alpha 0\.05, as given\. .* more than the 1 bp allowed\./)
  })
})
