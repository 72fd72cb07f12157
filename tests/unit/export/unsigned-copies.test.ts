import fc from 'fast-check'
import { describe, expect, it } from 'vitest'
import { fillSheets } from '~~/server/lib/table-files'
import { arbitraryContent, testKey } from './fixtures'

// The unsigned copy of a version's fill: every sheet says "not signed off" in its name, in full. Excel refuses sheet
// names over 31 characters (Microsoft's documented worksheet name limit), and exceljs then cuts them.
describe('unsigned copies', () => {
  it('name every sheet "..., not signed off" within 31 characters', () => {
    const key = testKey()
    fc.assert(fc.property(arbitraryContent(key.kid), (content) => {
      const names = fillSheets(content, 'NOT SIGNED OFF: a working copy').map(s => s.name)
      for (const name of names) {
        expect(name.length).toBeLessThanOrEqual(31)
        expect(name).toMatch(/, not signed off$/)
      }
    }), { numRuns: 5 })
  })
})
