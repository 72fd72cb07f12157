// Number and time text that never depends on the machine's locale data (ICU): what goes into a signed workbook is
// rebuilt cell by cell when the file is verified, possibly years later on another machine, so it must come out the same.

/** 12345 -> "12,345". */
export function groupThousands(n: number): string {
  const [int, frac] = String(Math.abs(n)).split('.')
  const grouped = int!.replace(/\B(?=(\d{3})+(?!\d))/g, ',')
  return `${n < 0 ? '-' : ''}${grouped}${frac ? `.${frac}` : ''}`
}

const MONTHS = ['Jan', 'Feb', 'Mar', 'Apr', 'May', 'Jun', 'Jul', 'Aug', 'Sep', 'Oct', 'Nov', 'Dec']
const FULL = ['January', 'February', 'March', 'April', 'May', 'June', 'July', 'August', 'September', 'October', 'November', 'December']

/** An instant in the app's own date format, in UTC: "2 Dec 2026, 08:42:31 UTC"; a missing one is a dash. */
export function formatUtc(iso: string | null | undefined): string {
  if (!iso) return '—'
  const d = new Date(iso)
  if (Number.isNaN(d.getTime())) return iso
  const two = (v: number) => String(v).padStart(2, '0')
  return `${d.getUTCDate()} ${MONTHS[d.getUTCMonth()]} ${d.getUTCFullYear()}, ${two(d.getUTCHours())}:${two(d.getUTCMinutes())}:${two(d.getUTCSeconds())} UTC`
}

/** "2 Dec 2026" -> "2026-12-02" (also "2 December 2026", "02 dec 2026" and "2026-12-02"); null when it is not a calendar date. */
export function parseDay(text: string): string | null {
  const t = text.trim()
  let y: number, m: number, d: number
  const iso = /^(\d{4})-(\d{1,2})-(\d{1,2})$/.exec(t)
  const words = /^(\d{1,2})\s+([A-Za-z]{3,9})\.?,?\s+(\d{4})$/.exec(t)
  if (iso) [y, m, d] = [Number(iso[1]), Number(iso[2]), Number(iso[3])]
  else if (words) {
    const month = FULL.findIndex(name => name.toLowerCase().startsWith(words[2]!.toLowerCase()))
    if (month < 0) return null
    ;[y, m, d] = [Number(words[3]), month + 1, Number(words[1])]
  } else return null
  const date = new Date(Date.UTC(y, m - 1, d))
  if (date.getUTCFullYear() !== y || date.getUTCMonth() !== m - 1 || date.getUTCDate() !== d) return null
  return `${String(y).padStart(4, '0')}-${String(m).padStart(2, '0')}-${String(d).padStart(2, '0')}`
}

/** "2026-12-02" -> "2 Dec 2026" (the app's own day format, utils/date-format.ts formatDay, without locale data). */
export function dayText(day: string): string {
  const [y, m, d] = day.split('-').map(Number)
  return `${d} ${MONTHS[m! - 1]} ${y}`
}
