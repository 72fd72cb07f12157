// One way to write dates everywhere: day first with the month as a word ("2 Dec 2026"), never 02/12/2026,
// which reads as February in some places. Times are the viewer's local time; instants (audit, signatures) carry the zone.

/** "2 Dec 2026"; a missing date is a dash. */
export function formatDay(iso: string | null | undefined): string {
  return iso ? new Date(iso).toLocaleDateString('en-GB', { day: 'numeric', month: 'short', year: 'numeric' }) : '—'
}

export function formatWhen(iso: string | null | undefined): string {
  return iso ? new Date(iso).toLocaleString('en-GB', { day: 'numeric', month: 'short', year: 'numeric', hour: '2-digit', minute: '2-digit' }) : ''
}

export function formatInstant(iso: string | null | undefined): string {
  return iso ? new Date(iso).toLocaleString('en-GB', { day: 'numeric', month: 'short', year: 'numeric', hour: '2-digit', minute: '2-digit', second: '2-digit', timeZoneName: 'short' }) : ''
}
