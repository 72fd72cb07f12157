// Old-age closure: extrapolation 'gompertz' and 'kannisto' for mortality. Outside references named beside each check:
// - the laws themselves (Gompertz 1825: mu = B c^x; Kannisto, as in the Human Mortality Database methods protocol,
//   Wilmoth et al., v6 2021: mu = a e^(b (x - x0)) / (1 + a e^(b (x - x0)))): data generated from a law are continued
//   exactly (fast-check properties);
// - numpy.polyfit and scipy.optimize.least_squares fitting the same laws to ln h on data that follow neither (the
//   Standard Ultimate Life Table's Makeham law, AMLCR, parameters from memory), through
//   tests/reference/closure_reference.py or its committed output closure-fixture.json.
import Decimal from 'decimal.js'
import fc from 'fast-check'
import { describe, expect, it } from 'vitest'
import { EngineError, fill, type FillRequest } from '~~/server/engine'
import { loadReference } from './reference'

const H = Decimal.clone({ precision: 100 })

/** q_x = 1 - exp(-h_x), h_x the integral of mu over [x, x+1]. */
const gompertzQ = (B: Decimal, c: Decimal) => (x: Decimal) => new H(1).minus(B.times(c.pow(x)).times(c.minus(1)).div(c.ln()).neg().exp())
const kannistoQ = (a: Decimal, b: Decimal, x0: Decimal) => (x: Decimal) => {
  const g = (t: Decimal) => a.times(b.times(t).exp()).plus(1).ln()
  return new H(1).minus(g(x.plus(1).minus(x0)).minus(g(x.minus(x0))).div(b).neg().exp())
}

function closed(law: (x: Decimal) => Decimal, rule: 'gompertz' | 'kannisto', last: number, step: number, terminal: number, options: Record<string, string> = {}) {
  const knots = Array.from({ length: 9 }, (_, i) => last - (8 - i) * step).map(x => ({ x: String(x), y: law(new H(x)).toSD(80).toString() }))
  const request: FillRequest = { knots, method: 'pchip', transform: 'log', kind: 'mortality', extrapolation: rule, extrapolationOptions: { terminalAge: String(terminal), ...options }, grid: { from: String(knots[0]!.x), to: String(terminal + 2), step: '1' }, precision: 30 }
  return { knots, result: fill(request) }
}

describe('data that follow the law are continued exactly (property)', () => {
  it('gompertz', () => {
    fc.assert(fc.property(fc.integer({ min: 5, max: 80 }), fc.integer({ min: 1050, max: 1150 }), fc.integer({ min: 85, max: 105 }), fc.constantFrom(1, 2, 5), fc.integer({ min: 110, max: 125 }), (b, c1000, last, step, terminal) => {
      const law = gompertzQ(new H(b).times('1e-6'), new H(c1000).div(1000))
      fc.pre(terminal > last && law(new H(last)).lt('0.999')) // beyond that 1 - q keeps too few digits of the given q
      const { result } = closed(law, 'gompertz', last, step, terminal)
      for (const p of result.points) {
        const x = new H(p.x)
        if (x.lte(last)) continue
        const expected = x.gte(terminal) ? new H(1) : law(x)
        expect(new H(p.y).minus(expected).abs().lte('1e-29'), `x = ${p.x}: ${p.y} vs ${expected.toSD(32)}`).toBe(true)
      }
      expect(new H(result.diagnostics.closure!.maxLogHazardResidual).lt('1e-32')).toBe(true)
    }), { numRuns: 10 })
  })

  it('kannisto', () => {
    fc.assert(fc.property(fc.integer({ min: 10, max: 300 }), fc.integer({ min: 60, max: 160 }), fc.integer({ min: 90, max: 105 }), fc.constantFrom(1, 5), (a1000, b1000, last, step) => {
      const x0 = new H(last - 15)
      const law = kannistoQ(new H(a1000).div(1000), new H(b1000).div(1000), x0)
      const { result } = closed(law, 'kannisto', last, step, 120)
      for (const p of result.points) {
        const x = new H(p.x)
        if (x.lte(last)) continue
        const expected = x.gte(120) ? new H(1) : law(x)
        expect(new H(p.y).minus(expected).abs().lte('1e-29'), `x = ${p.x}: ${p.y} vs ${expected.toSD(32)}`).toBe(true)
      }
      const params = result.diagnostics.closure!.parameters
      expect(new H(params.b!).minus(new H(b1000).div(1000)).abs().lt('1e-11')).toBe(true)
      expect(params.x0).toBe(x0.toString())
    }), { numRuns: 10 })
  })
})

describe('fits against numpy / SciPy on data that follow neither law (Makeham, AMLCR Standard Ultimate Life Table, from memory)', () => {
  const ref = loadReference<{ knots: { x: string, y: string }[], gompertz: { B: number, c: number, q: Record<string, number> }, kannisto: { a: number, b: number, q: Record<string, number> } }>('closure_reference.py', 'closure-fixture.json', 'Closure reference')
  for (const rule of ['gompertz', 'kannisto'] as const) {
    it(`${rule}: parameters and q at 101..119 as fitted by ${rule === 'gompertz' ? 'numpy.polyfit' : 'scipy.optimize.least_squares'}`, () => {
      const r = fill({ knots: ref.knots, method: 'cubic-natural', transform: 'log', kind: 'mortality', extrapolation: rule, grid: { from: '60', to: '120', step: '1' }, precision: 40 })
      const c = r.diagnostics.closure!
      expect(c.fitFrom).toBe('85')
      expect(c.fitTo).toBe('100')
      expect(c.fitAges).toBe(4)
      const expected = ref[rule]
      for (const [name, value] of Object.entries(expected).filter(([k]) => k !== 'q' && k !== 'x0')) {
        expect(Math.abs(Number(c.parameters[name]) / (value as number) - 1), name).toBeLessThan(1e-7)
      }
      for (const [age, q] of Object.entries(expected.q)) {
        const ours = Number(r.points.find(p => p.x === age)!.y)
        expect(Math.abs(ours / q - 1), `age ${age}`).toBeLessThan(1e-8)
      }
      expect(Number(c.maxLogHazardResidual)).toBeGreaterThan(1e-6) // Makeham is neither law
      expect(r.points.find(p => p.x === '120')!.y).toBe('1')
    })
  }
})

describe('closure: spec, money and refusals', () => {
  const knots = [70, 75, 80, 85, 90, 95, 100].map(x => ({ x: String(x), y: gompertzQ(new H('0.00002'), new H('1.1'))(new H(x)).toSD(12).toString() }))
  const base: FillRequest = { knots, method: 'pchip', kind: 'mortality', extrapolation: 'gompertz', grid: { from: '70', to: '120', step: '1' }, money: { ages: [75] } }

  it('records the options with defaults in the spec, re-runs from it, and closes the table for the money view', () => {
    const r = fill(base)
    expect(r.spec.extrapolationOptions).toEqual({ terminalAge: '120', fitFrom: '85', fitTo: '100' })
    const again = fill({ ...base, extrapolationOptions: r.spec.extrapolationOptions! })
    expect(again.points).toEqual(r.points)
    // e_75 runs through the closed ages up to 120, where q = 1
    expect(r.money.available).toBe(true)
    expect(fill({ ...base, grid: { from: '70', to: '100', step: '1' } }).money.figures.find(f => f.key === 'e(75)')!.value).not.toBe(r.money.figures.find(f => f.key === 'e(75)')!.value)
    expect(r.diagnostics.notes.some(n => n.includes("rule 'gompertz'"))).toBe(true)
    expect(fill({ ...base, extrapolation: 'flat' }).spec.extrapolationOptions).toBeNull()
  })

  it('refuses what it cannot close, with clear messages', () => {
    const msg = (request: FillRequest) => { try { fill(request); return null } catch (e) { return e instanceof EngineError ? `${e.code}: ${e.message}` : String(e) } }
    expect(msg({ ...base, kind: 'lapse' })).toBe("invalid-request: Extrapolation 'gompertz' applies to mortality tables; this table's kind is 'lapse'.")
    expect(msg({ ...base, grid: { from: '65', to: '120', step: '1' } })).toBe("outside-knots: Grid point 1 (x = 65) lies below the first given age 70; extrapolation 'gompertz' closes the table at old ages only. Start the grid at 70.")
    expect(msg({ ...base, extrapolation: 'flat', extrapolationOptions: { terminalAge: '110' } })).toBe("invalid-option: extrapolationOptions apply to the closure rules gompertz and kannisto; extrapolation 'flat' takes none.")
    expect(msg({ ...base, extrapolationOptions: { terminalAge: '100' } })).toBe('invalid-option: The terminal age (100) must lie above the last given age (100).')
    expect(msg({ ...base, extrapolationOptions: { fitFrom: '99' } })).toMatch(/^too-few-points: Closure by gompertz is fitted to the given ages from 99 to 100; 1 lies there/)
    expect(msg({ ...base, extrapolationOptions: { age: '1' } })).toBe("invalid-option: Closure has no option 'age'; it takes terminalAge, fitFrom, fitTo.")
    const falling = knots.map((k, i) => ({ x: k.x, y: String(0.3 - i * 0.01) }))
    expect(msg({ ...base, knots: falling, extrapolation: 'kannisto' })).toMatch(/^transform-domain: Closure by kannisto: q does not rise/)
  })
})
