import { describe, expect, it } from 'vitest'
import { dayText, formatUtc, groupThousands, parseDay } from '#shared/plain-text'

// The app's own day format ("2 Dec 2026", utils/date-format.ts) read and written without locale data.
describe('plain text for signed files and the audit filter', () => {
  it('groups thousands and writes instants in UTC the same everywhere', () => {
    expect([groupThousands(0), groupThousands(999), groupThousands(1234567), groupThousands(-12345.5)]).toEqual(['0', '999', '1,234,567', '-12,345.5'])
    expect(formatUtc('2026-12-02T08:04:05.123Z')).toBe('2 Dec 2026, 08:04:05 UTC')
    expect(formatUtc(null)).toBe('—')
  })

  it('reads days as people write them in the app format, and refuses what is not a calendar date', () => {
    expect(parseDay('2 Dec 2026')).toBe('2026-12-02')
    expect(parseDay('02 december 2026')).toBe('2026-12-02')
    expect(parseDay('29 Feb 2024')).toBe('2024-02-29')
    expect(parseDay('2026-12-2')).toBe('2026-12-02')
    expect(parseDay('29 Feb 2026')).toBeNull()
    expect(parseDay('12/02/2026')).toBeNull()
    expect(parseDay('2 Foo 2026')).toBeNull()
    expect(parseDay('2 D 2026')).toBeNull()
    expect(dayText('2026-12-02')).toBe('2 Dec 2026')
  })
})
