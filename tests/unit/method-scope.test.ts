// The bench offers a method only where the engine takes it: by table kind and by the spacing and number of the given
// points. The listing is the engine's own (METHODS), and every "offered" verdict is checked against the engine itself.
import { describe, expect, it } from 'vitest'
import { METHODS, fill } from '~~/server/engine/index'
import { TABLE_KINDS } from '~~/server/engine/types'
import { equallySpaced, methodScope, offeredMethods } from '#shared/method-scope'
import { closureVerdict } from '#shared/check-words'
import { closureRows } from '#shared/fill-words'
import { extrapolationRulesFor } from '#shared/fills'

const FIVE_YEAR = ['55', '60', '65', '70', '75', '80', '85', '90']
// standard tenors of a quoted curve (domain brief): unequal steps
const TENORS = ['0.25', '0.5', '1', '2', '3', '5', '7', '10', '15', '20', '30']

describe('equal spacing', () => {
  it('is exact in decimals', () => {
    expect(equallySpaced(FIVE_YEAR)).toBe(true)
    expect(equallySpaced(['0.1', '0.2', '0.3'])).toBe(true) // 0.1 + 0.1 + 0.1 is 0.3 in decimals, not in binary floats
    expect(equallySpaced(TENORS)).toBe(false)
    expect(equallySpaced(['1', '2', '3', '5'])).toBe(false)
  })
})

describe('methods offered', () => {
  it('leaves the osculatory methods out for unequally spaced tenors, with a reason in words', () => {
    const ids = offeredMethods(METHODS, 'spot-rate', TENORS).map(l => l.id)
    expect(ids).not.toContain('sprague')
    expect(ids).not.toContain('karup-king')
    expect(ids).toContain('pchip')
    const scope = methodScope(METHODS.find(m => m.id === 'beers')!, 'spot-rate', TENORS)
    expect(scope).toEqual({ offered: false, reason: 'needs equally spaced given points (these are not)' })
  })

  it('offers them for five-year ages, and not below their fewest points', () => {
    const ids = offeredMethods(METHODS, 'mortality', FIVE_YEAR).map(l => l.id)
    expect(ids).toEqual(expect.arrayContaining(['karup-king', 'sprague', 'beers']))
    const few = methodScope(METHODS.find(m => m.id === 'beers')!, 'mortality', FIVE_YEAR.slice(0, 3))
    expect(few.offered).toBe(false)
  })

  it('agrees with the engine: every offered method fills, every method refused for spacing is refused by the engine', () => {
    // plausible values of each kind: discount factors e^(-0.03 t), else gently rising rates
    const knots = (xs: string[], kind: string) => xs.map((x, i) => ({ x, y: kind === 'discount-factor' ? Math.exp(-0.03 * Number(x)).toPrecision(12) : String(0.01 + 0.002 * i + 0.0001 * i * i) }))
    for (const kind of TABLE_KINDS) {
      for (const xs of [FIVE_YEAR, TENORS]) {
        for (const listing of METHODS) {
          const scope = methodScope(listing, kind, xs)
          const run = () => fill({ knots: knots(xs, kind), kind, method: listing.id, at: [xs[0]!, xs.at(-1)!] })
          if (scope.offered) expect(run, `${listing.id} on ${kind}`).not.toThrow()
          else if (scope.reason.includes('spaced')) expect(run).toThrow(/equally spaced/)
        }
      }
    }
  })
})

describe('old-age closure in words', () => {
  it('is offered for mortality tables only', () => {
    expect(extrapolationRulesFor('mortality')).toEqual(expect.arrayContaining(['gompertz', 'kannisto']))
    expect(extrapolationRulesFor('spot-rate')).not.toContain('gompertz')
  })

  it('says the law, the fitting ages, the fit and the join', () => {
    // Gompertz data (mu = B c^x, B = 2.7e-6, c = 1.124: the Standard Ultimate Life Table's Makeham B and c, AMLCR, from memory,
    // without A) are continued exactly by the Gompertz closure: zero misfit on the hazard scale
    const B = 2.7e-6; const c = 1.124
    const q = (x: number) => String(1 - Math.exp(-B * c ** x * (c - 1) / Math.log(c)))
    const knots = [80, 85, 90, 95, 100].map(x => ({ x: String(x), y: q(x) }))
    const r = fill({ knots, kind: 'mortality', method: 'pchip', extrapolation: 'gompertz', extrapolationOptions: { fitFrom: '85' }, grid: { from: '80', to: '120', step: '1' } })
    const v = closureVerdict(r.diagnostics.closure!, 'per-mille')
    expect(v.good).toBe(true)
    expect(v.text).toMatch(/^Gompertz law fitted to 4 given ages from 85 to 100: it fits them within 0.01 % of the hazard and .*; q reaches 1 at age 120\.$/)
    expect(closureRows(r.spec)).toEqual([
      { label: 'Terminal age', value: '120 (q = 1 from there)' },
      { label: 'Law fitted to the given ages', value: '85 to 100' },
    ])
    expect(closureRows({ ...r.spec, extrapolation: 'flat' })).toEqual([])
  })
})
