// extrapolation 'method': the method carries on by its own rule beyond the knots. Required by smith-wilson beyond its last
// knot (its formula runs to the ultimate forward rate; EIOPA technical documentation), refused with a message by every
// method that has no extension of its own. Source: the rules; messages are the user's to act on.
import { describe, expect, it } from 'vitest'
import { METHODS, compare, fill, type FillRequest } from '~~/server/engine'
import { engineErrorOf, knots } from './helpers'

const curve = knots(['1', '2', '5', '10', '20'], ['0.03', '0.031', '0.033', '0.034', '0.0345'])
const SW: FillRequest = { knots: curve, method: 'smith-wilson', options: { ufr: '0.036', alpha: '0.1' }, kind: 'spot-rate', extrapolation: 'method', at: ['0', '1', '30', '120'] }

describe("extrapolation 'method'", () => {
  it('is refused by every method without an extension of its own', () => {
    for (const method of ['linear', 'log-linear', 'quadratic', 'cubic-natural', 'cubic-clamped', 'cubic-not-a-knot', 'pchip', 'akima', 'monotone-convex'] as const) {
      const e = engineErrorOf({ knots: curve, method, kind: 'spot-rate', extrapolation: 'method', at: ['1'] })
      expect(e.code).toBe('not-applicable')
      expect(e.message).toBe(`Method ${method} has no extension of its own beyond the knots; choose extrapolation 'error', 'flat' or 'linear'.`)
    }
  })

  it("is required by smith-wilson beyond the last knot: 'error' refuses there and says so, 'flat' and 'linear' are refused", () => {
    expect(fill(SW).points).toHaveLength(4)
    const e = engineErrorOf({ ...SW, extrapolation: 'error' })
    expect(e.message).toBe("Requested point 3 (x = 30) lies outside the knots [0, 20] and extrapolation is 'error'; choose extrapolation 'method' (the method's own extension), or keep the points inside the knots.")
    for (const rule of ['flat', 'linear'] as const) expect(engineErrorOf({ ...SW, extrapolation: rule }).code).toBe('not-applicable')
    expect(engineErrorOf({ ...SW, at: ['-1'] }).message).toBe('Term -1 lies before t = 0, where the curve starts.')
  })

  it('lists, for each method, the rules it takes and the kinds it fills', () => {
    const by = Object.fromEntries(METHODS.map(m => [m.id, m]))
    expect(by['smith-wilson']!.extrapolation).toEqual(['error', 'method'])
    expect(by['monotone-convex']!.extrapolation).toEqual(['error', 'flat', 'linear', 'gompertz', 'kannisto'])
    expect(by['cubic-natural']!.extrapolation).toEqual(['error', 'flat', 'linear', 'gompertz', 'kannisto'])
    expect(by['smith-wilson']!.appliesTo).toEqual({ kinds: ['spot-rate', 'discount-factor'], spacing: 'any' })
    expect(by['monotone-convex']!.appliesTo).toEqual({ kinds: ['spot-rate', 'discount-factor'], spacing: 'any' })
    expect(by['pchip']!.appliesTo).toEqual({ kinds: ['mortality', 'lapse', 'salary', 'spot-rate', 'discount-factor', 'other'], spacing: 'any' })
  })

  it('a comparison under one rule reports the methods that refuse it and fills the others', () => {
    const r = compare({ ...SW, method: 'smith-wilson' }, [{ method: 'smith-wilson', options: SW.options }, { method: 'cubic-natural' }])
    expect(r.entries[0]!.ok).toBe(true)
    expect(r.entries[1]).toMatchObject({ ok: false, code: 'not-applicable' })
  })
})
