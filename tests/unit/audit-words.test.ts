import { describe, expect, it } from 'vitest'
import { describeAuditEvent, type AuditFacts } from '#shared/audit-words'
import { METHODS } from '~~/server/engine'

// Audit events read as sentences with names, never ids or key: value dumps.
const TABLE = '3f1c1e2a-8d7b-4c55-9a51-6a1c2b3d4e5f'
const PERSON = '7a2b9c1d-4e5f-4a6b-8c7d-9e0f1a2b3c4d'
const names = { table: (id: string) => (id === TABLE ? 'Pensioner mortality, male' : null), person: (id: string) => (id === PERSON ? 'Priya Raman' : null) }
const say = (e: Partial<AuditFacts>) => describeAuditEvent({ outcome: 'ok', objectType: null, objectId: null, detail: {}, action: '', ...e }, names, METHODS)

describe('audit events as sentences', () => {
  it('names tables and people, and says what happened', () => {
    expect(say({ action: 'version.approve', detail: { tableId: TABLE, number: 3, supersedes: [2], comment: null } })).toBe('Signed off version 3 of Pensioner mortality, male, which withdrew version 2.')
    expect(say({ action: 'version.approve', outcome: 'denied', detail: { tableId: TABLE, number: 3, reason: 'own work' } })).toMatch(/refused, because they made, filled or submitted it/)
    expect(say({ action: 'member.role-change', objectType: 'user', objectId: PERSON, detail: { from: 'analyst', to: 'actuary' } })).toBe('Changed the role of Priya Raman from analyst to actuary.')
    expect(say({ action: 'billing.seats-change', detail: { from: 5, to: 8 } })).toMatch(/^Changed the seats from 5 to 8/)
    expect(say({ action: 'version.create', detail: { tableId: TABLE, number: 2, from: 1 } })).toBe('Started version 2 of Pensioner mortality, male from version 1.')
  })

  it('tells a fill in words: method and option values from the engine\u2019s listing, not ids', () => {
    const s = say({ action: 'version.fill.save', detail: { tableId: TABLE, number: 2, method: 'quadratic', options: { condition: 'right-zero-curvature' }, points: 56, rationale: 'Zig-zags less on the right.' } })
    expect(s).toBe('Chose Quadratic spline · Straight last piece as the fill of version 2 of Pensioner mortality, male (56 values). Reasons: “Zig-zags less on the right.”')
  })

  it('says so when a table or a person is no longer held, and never prints a raw record', () => {
    expect(say({ action: 'export.download', detail: { tableId: '00000000-0000-0000-0000-000000000000', number: 1 } })).toBe('Downloaded the signed workbook of version 1 of a table no longer held.')
    expect(say({ action: 'member.remove', objectType: 'user', objectId: 'gone', detail: { role: 'auditor' } })).toBe('Removed a former member (was auditor).')
    expect(say({ action: 'something.new', detail: { x: 1 } })).toBe('something.new.')
  })
})
