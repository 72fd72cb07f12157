// Splitting group totals into single-year values. Outside references named beside each check: the published group
// multipliers of Siegel and Swanson, The Methods and Materials of Demography, 2nd ed., 2004, Appendix C (through
// tests/reference/osculatory_reference.py or its committed output; transcribed, not checked against the printed page);
// polynomial reproduction (the cumulative of a degree-d polynomial is a polynomial of degree d + 1, Faulhaber) and total
// preservation as fast-check properties; Hamilton's largest-remainder rule for the rounding residue (definition).
import Decimal from 'decimal.js'
import fc from 'fast-check'
import { describe, expect, it } from 'vitest'
import { EngineError, split, type SplitMethodId } from '~~/server/engine'
import { roundToTotal } from '~~/server/engine/split'
import { decimalContext } from '~~/server/engine/decimal'
import { loadReference } from './reference'

const H = Decimal.clone({ precision: 120 })
const ref = loadReference<{ publishedSplit: Record<'sprague' | 'beers', (string | null)[][][]> }>('osculatory_reference.py', 'osculatory-fixture.json', 'Osculatory reference')

const bands = (totals: (string | number)[], width = 5, start = 0) => totals.map((t, k) => ({ from: String(start + k * width), to: String(start + (k + 1) * width - 1), total: String(t) }))

describe('split against the published multipliers (Siegel and Swanson 2004, App. C)', () => {
  const totals = [1000, 800, 700, 900, 1200, 1100, 950, 1020]
  for (const method of ['sprague', 'beers'] as const) {
    it(`${method}: every single year is the published multipliers applied to the neighbouring totals`, () => {
      const r = split({ groups: bands(totals), method, precision: 40 })
      const table = ref.publishedSplit[method]
      const n = totals.length
      // panel p splits group groupOf[p]; its published columns are the groups from firstColumn[p]
      const groupOf = [0, 1, 3, n - 2, n - 1]
      const firstColumn = [0, 0, 1, n - 5, n - 5]
      table.forEach((panel, p) => panel.forEach((row, year) => {
        const expected = row.reduce((s: Decimal, m, c) => (m === null ? s : s.plus(new H(m).times(totals[firstColumn[p]! + c]!))), new H(0))
        const x = groupOf[p]! * 5 + year
        expect(r.points[x]!.x).toBe(String(x))
        expect(r.points[x]!.y, `${method} panel ${p + 1} year ${year}`).toBe(expected.toString())
      }))
      expect(r.diagnostics.totalsKept).toBe(true)
      expect(r.spec).toMatchObject({ method, precision: 40, width: 5, rounding: 'half-even, residue by largest remainder' })
    })
  }
})

const METHODS: SplitMethodId[] = ['sprague', 'beers', 'karup-king']
const MIN_GROUPS: Record<SplitMethodId, number> = { 'sprague': 4, 'beers': 5, 'karup-king': 2 }

describe('totals kept to the last digit (property)', () => {
  for (const method of METHODS) {
    it(`${method}: each group adds up to its total rounded to p digits, each value within one unit of its last place of the exact split`, () => {
      fc.assert(fc.property(
        fc.array(fc.integer({ min: 1, max: 99_999_999 }), { minLength: MIN_GROUPS[method], maxLength: 14 }),
        fc.integer({ min: -4, max: 6 }), fc.integer({ min: 6, max: 40 }), fc.integer({ min: 2, max: 9 }),
        (ints, shift, p, w) => {
          const width = method === 'beers' ? 5 : w
          const totals = ints.map(t => new H(t).times(new H(10).pow(shift)).toString())
          const r = split({ groups: bands(totals, width, 20), method, precision: p })
          const exact = split({ groups: bands(totals, width, 20), method, precision: p + 60 })
          expect(r.diagnostics.totalsKept).toBe(true)
          totals.forEach((t, k) => {
            const values = r.points.slice(k * width, (k + 1) * width).map(pt => new H(pt.y))
            const sum = values.reduce((s, v) => s.plus(v), new H(0))
            expect(sum.eq(new H(t).toSD(p, Decimal.ROUND_HALF_EVEN)), `group ${k}: ${sum} vs ${t}`).toBe(true)
            const quantum = new H(10).pow(new H(t).toSD(p).e - p + 1)
            values.forEach((v, j) => expect(v.minus(exact.points[k * width + j]!.y).abs().lte(quantum)).toBe(true))
          })
        },
      ), { numRuns: 30 })
    })
  }
})

/** Integer coefficients in thousandths; f(x) exact. */
const value = (c: number[], x: number) => c.reduceRight((acc, a) => acc.times(x).plus(new H(a).div(1000)), new H(0))

describe('polynomial reproduction (property)', () => {
  const cases: [SplitMethodId, number][] = [['karup-king', 1], ['sprague', 3], ['beers', 3]]
  for (const [method, degree] of cases) {
    it(`${method}: single-year values on a polynomial of degree ${degree} come back exactly from their group totals`, () => {
      fc.assert(fc.property(fc.array(fc.integer({ min: -3000, max: 3000 }), { minLength: degree + 1, maxLength: degree + 1 }), fc.integer({ min: 6, max: 12 }), fc.integer({ min: 2, max: 7 }), fc.integer({ min: 0, max: 90 }), (c, n, w, start) => {
        const width = method === 'beers' ? 5 : w
        const totals = Array.from({ length: n }, (_, k) => Array.from({ length: width }, (_, j) => value(c, start + k * width + j)).reduce((s, v) => s.plus(v), new H(0)))
        const r = split({ groups: bands(totals.map(t => t.toString()), width, start), method, precision: 30 })
        r.points.forEach(p => expect(new H(p.y).eq(value(c, Number(p.x))), `${method} at ${p.x}: ${p.y} vs ${value(c, Number(p.x))}`).toBe(true))
      }), { numRuns: 40 })
    })
  }

  it('sprague does not reproduce degree 4 (the claim is tight)', () => {
    const totals = Array.from({ length: 8 }, (_, k) => Array.from({ length: 5 }, (_, j) => (k * 5 + j) ** 4).reduce((s, v) => s + v, 0))
    const r = split({ groups: bands(totals), method: 'sprague', precision: 30 })
    expect(r.points.some(p => !new H(p.y).eq(Number(p.x) ** 4))).toBe(true)
  })
})

describe('rounding residue and flags', () => {
  it("places the residue by the largest remainder (Hamilton's rule), ties to the lowest age", () => {
    const D = decimalContext(20)
    const r = roundToTotal(['0.335', '0.335', '0.33'].map(v => new D(v)), new D(1), 2)
    expect(r.rounded.map(v => v.toString())).toEqual(['0.4', '0.3', '0.3'])
    expect(r.adjusted).toEqual([0])
    const down = roundToTotal(['0.36', '0.37', '0.27'].map(v => new D(v)), new D(1), 2)
    // 0.4 + 0.4 + 0.3 = 1.1: one tenth comes off the value rounded up most (0.36, by 0.04)
    expect(down.rounded.map(v => v.toString())).toEqual(['0.3', '0.4', '0.3'])
  })

  it('flags negative single-year values where the totals change sharply', () => {
    const r = split({ groups: bands([5, 5, 5, 5000, 5, 5, 5]), method: 'sprague', precision: 20 })
    expect(r.diagnostics.negatives.count).toBeGreaterThan(0)
    expect(r.diagnostics.negatives.first[0]!.value.startsWith('-')).toBe(true)
    expect(r.diagnostics.notes[0]).toMatch(/negative/)
    expect(r.diagnostics.totalsKept).toBe(true)
  })

  it('refuses gaps, overlaps, unequal widths, too few groups, and Beers on groups other than 5 years', () => {
    const code = (f: () => unknown) => { try { f(); return null } catch (e) { return e instanceof EngineError ? `${e.code}: ${e.message}` : String(e) } }
    expect(code(() => split({ groups: [...bands([1, 2]), { from: '11', to: '15', total: '3' }, ...bands([4], 5, 16)], method: 'karup-king' }))).toBe('invalid-group: Groups must follow each other without gap or overlap: group 2 ends at 9 but group 3 starts at 11.')
    expect(code(() => split({ groups: [...bands([1, 2, 3]), { from: '15', to: '24', total: '3' }], method: 'sprague' }))).toMatch(/^invalid-group: Every group must have the same width/)
    expect(code(() => split({ groups: bands([1, 2, 3]), method: 'sprague' }))).toBe('too-few-points: Method sprague splits at least 4 groups; 3 were given.')
    expect(code(() => split({ groups: bands([1, 2, 3, 4, 5, 6], 10), method: 'beers' }))).toMatch(/^invalid-group: Beers' coefficients are published for fifths only/)
    expect(code(() => split({ groups: [{ from: '0', to: '4.5', total: '1' }], method: 'sprague' }))).toMatch(/^invalid-group: Group 1 \(0 to 4.5\)/)
    expect(code(() => split({ groups: bands([1, 2, 3, 4]), method: 'pchip' as SplitMethodId }))).toBe('unknown-method: Method \'pchip\' cannot split group totals; choose one of sprague, beers, karup-king.')
  })
})
