// One way to write dates everywhere: day first with the month as a word ("2 Dec 2026"), never 02/12/2026,
// which reads as February in some places. Built from our own month names, not the machine's locale data (ICU
// writes "Sept" in some versions). Times are the reader's local time; instants (audit, signatures) carry the zone.

const MONTHS = ['Jan', 'Feb', 'Mar', 'Apr', 'May', 'Jun', 'Jul', 'Aug', 'Sep', 'Oct', 'Nov', 'Dec']
const two = (v: number) => String(v).padStart(2, '0')

function parsed(iso: string | Date | null | undefined): Date | null {
  if (!iso) return null
  const d = new Date(iso)
  return Number.isNaN(d.getTime()) ? null : d
}

const day = (d: Date) => `${d.getDate()} ${MONTHS[d.getMonth()]} ${d.getFullYear()}`

/** "2 Dec 2026"; a missing date is a dash. */
export function formatDay(iso: string | Date | null | undefined): string {
  const d = parsed(iso)
  return d ? day(d) : '—'
}

/** "2 Dec 2026, 07:27" (24-hour clock); a missing date is ''. */
export function formatWhen(iso: string | Date | null | undefined): string {
  const d = parsed(iso)
  return d ? `${day(d)}, ${two(d.getHours())}:${two(d.getMinutes())}` : ''
}

/** The reader's zone as a short name ("UTC", "CET", "GMT+2"). */
function zoneName(d: Date): string {
  try {
    return new Intl.DateTimeFormat('en-GB', { timeZoneName: 'short' }).formatToParts(d).find(p => p.type === 'timeZoneName')?.value ?? ''
  } catch { return '' }
}

/** "2 Dec 2026, 07:27:31 UTC": an instant to the second, with the zone; a missing one is ''. */
export function formatInstant(iso: string | Date | null | undefined): string {
  const d = parsed(iso)
  if (!d) return ''
  const zone = zoneName(d)
  return `${day(d)}, ${two(d.getHours())}:${two(d.getMinutes())}:${two(d.getSeconds())}${zone ? ` ${zone}` : ''}`
}

/** The one pattern every visible date matches (the browser test checks the pages against it). */
export const DATE_PATTERN = /\b\d{1,2} (?:Jan|Feb|Mar|Apr|May|Jun|Jul|Aug|Sep|Oct|Nov|Dec) \d{4}(?:, \d{2}:\d{2}(?::\d{2}(?: [A-Z][\w+:-]*)?)?)?/
