/**
 * Billing periods stepped from the billing-cycle anchor. Monthly and yearly periods follow calendar months in UTC,
 * clamped to the last day of a shorter month and returning to the anchor day afterwards, as Stripe documents
 * ("Billing cycle", docs.stripe.com/billing/subscriptions/billing-cycle).
 */
export type Interval = 'day' | 'week' | 'month' | 'year'

export function addIntervals(anchor: number, interval: Interval, count: number, n: number): number {
  if (interval === 'day') return anchor + n * count * 86400
  if (interval === 'week') return anchor + n * count * 7 * 86400
  const d = new Date(anchor * 1000)
  const months = (interval === 'year' ? 12 : 1) * count * n
  const y = d.getUTCFullYear()
  const m = d.getUTCMonth() + months
  const lastDay = new Date(Date.UTC(y, m + 1, 0)).getUTCDate()
  const day = Math.min(d.getUTCDate(), lastDay)
  return Math.floor(Date.UTC(y, m, day, d.getUTCHours(), d.getUTCMinutes(), d.getUTCSeconds()) / 1000)
}

/** End of the period that starts at `start` (the first anchor-stepped boundary after it). */
export function nextBoundary(anchor: number, interval: Interval, count: number, start: number): number {
  for (let n = 1; n < 100000; n++) {
    const t = addIntervals(anchor, interval, count, n)
    if (t > start) return t
  }
  throw new Error('billing period overflow')
}
