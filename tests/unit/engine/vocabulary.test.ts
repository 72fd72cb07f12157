// The engine's vocabulary as a client reads it (shared/engine/contract.ts and the METHODS listing): data only, and
// enough to offer each method and rule only where it applies.
import { describe, expect, it } from 'vitest'
import { EXTRAPOLATION_KINDS, EXTRAPOLATION_RULES, METHOD_IDS, SPLIT_METHOD_IDS, TABLE_KINDS } from '#shared/engine/contract'
import { METHODS, fill, graduate, split } from '~~/server/engine'

describe('vocabulary', () => {
  it('lists every method id once, as data a client can use (JSON round trip)', () => {
    expect(METHODS.map(m => m.id)).toEqual([...METHOD_IDS])
    expect(JSON.parse(JSON.stringify(METHODS))).toEqual(METHODS)
  })

  it('says where each method applies: table kinds and spacing', () => {
    for (const m of METHODS) {
      expect(m.appliesTo.kinds.length).toBeGreaterThan(0)
      for (const k of m.appliesTo.kinds) expect(TABLE_KINDS).toContain(k)
      expect(m.appliesTo.spacing).toBe(['karup-king', 'sprague', 'beers'].includes(m.id) ? 'equal' : 'any')
    }
  })

  it('says where each extrapolation rule applies, and the engine refuses it elsewhere', () => {
    expect(Object.keys(EXTRAPOLATION_KINDS).sort()).toEqual([...EXTRAPOLATION_RULES].sort())
    const knots = [80, 85, 90, 95].map((x, i) => ({ x: String(x), y: String(0.05 * 1.5 ** i) }))
    // 'method' depends on the method as well (linear has no extension of its own): tests/unit/engine/extrapolation-method.test.ts
    for (const rule of EXTRAPOLATION_RULES.filter(r => r !== 'method')) {
      for (const kind of TABLE_KINDS) {
        const run = () => fill({ knots, method: 'linear', kind, extrapolation: rule, at: ['85'] })
        if (EXTRAPOLATION_KINDS[rule].includes(kind)) expect(run).not.toThrow()
        else expect(run).toThrow(/applies to/)
      }
    }
  })

  it('exports split and graduate beside fill, with their own method lists', () => {
    expect([...SPLIT_METHOD_IDS]).toEqual(['sprague', 'beers', 'karup-king'])
    expect(typeof split).toBe('function')
    expect(typeof graduate).toBe('function')
  })
})
