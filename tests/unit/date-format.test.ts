import { describe, expect, it } from 'vitest'

import { DATE_PATTERN, formatDay, formatInstant, formatWhen } from '~~/utils/date-format'

// Local-time dates built from their parts, so the checks hold in any time zone (test machines run in UTC).
describe('one date format (utils/date-format.ts)', () => {
  const d = new Date(2026, 11, 2, 7, 5, 9)
  it('writes a day as "2 Dec 2026", never with slashes or the locale\'s month names', () => {
    expect(formatDay(d)).toBe('2 Dec 2026')
    expect(formatDay(new Date(2026, 8, 30))).toBe('30 Sep 2026')
    expect(formatDay(null)).toBe('—')
    expect(formatDay('not a date')).toBe('—')
  })
  it('adds the time on a 24-hour clock, and the zone for an instant', () => {
    expect(formatWhen(d)).toBe('2 Dec 2026, 07:05')
    expect(formatWhen(new Date(2026, 0, 9, 19, 45))).toBe('9 Jan 2026, 19:45')
    expect(formatInstant(d)).toMatch(/^2 Dec 2026, 07:05:09 \S+$/)
    expect(formatWhen(undefined)).toBe('')
  })
  it('every form matches the one pattern', () => {
    for (const text of [formatDay(d), formatWhen(d), formatInstant(d)]) expect(text).toMatch(DATE_PATTERN)
    expect('02/12/2026, 07:27:27').not.toMatch(DATE_PATTERN)
  })
})
