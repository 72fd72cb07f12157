import { describe, expect, it } from 'vitest'
import { readTokenCreateSchema, readTokenFormSchema } from '#shared/schemas/read-tokens'

const messages = (r: { success: boolean, error?: { issues: { path: PropertyKey[], message: string }[] } }) =>
  Object.fromEntries((r.error?.issues ?? []).map(i => [i.path.join('.'), i.message]))

describe('read token schemas', () => {
  it('the form names both mistakes at once: no name, and "only these tables" with none ticked (zod runs the refinement despite the name issue)', () => {
    const r = readTokenFormSchema.safeParse({ name: ' ', scope: 'some', tables: [] })
    expect(messages(r)).toEqual({ name: 'Name the token after the system that will use it', tables: 'Pick at least one table, or let the token read every table' })
  })

  it('every table needs no list; a ticked table is enough', () => {
    expect(readTokenFormSchema.safeParse({ name: 'Valuation', scope: 'all', tables: [] }).success).toBe(true)
    expect(readTokenFormSchema.safeParse({ name: 'Valuation', scope: 'some', tables: ['x'] }).success).toBe(true)
  })

  it('the API takes no list (every table) or a non-empty list of ids', () => {
    expect(readTokenCreateSchema.safeParse({ name: 'Valuation' }).success).toBe(true)
    expect(readTokenCreateSchema.safeParse({ name: 'Valuation', tables: [] }).success).toBe(false)
    expect(readTokenCreateSchema.safeParse({ name: 'Valuation', tables: ['not-an-id'] }).success).toBe(false)
    expect(readTokenCreateSchema.safeParse({ name: 'Valuation', tables: ['7d444840-9dc0-41d5-8a6f-25d1b1d4c9f1'] }).success).toBe(true)
  })
})
