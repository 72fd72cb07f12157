/**
 * Time-based proration, per second, as Stripe documents it ("Prorations", docs.stripe.com/billing/subscriptions/prorations):
 *   amount = unit_amount × quantity × (period_end − proration_date) / (period_end − period_start)
 * A change creates a credit for the unused time on the old quantity/price and a charge for the remaining time on the
 * new one; the net is unit_amount × Δquantity × remaining fraction. Each line is rounded on its own to whole minor units,
 * half away from zero (Math.round on the absolute value), so the net can differ by 1 from rounding the net directly.
 */
export function prorate(unitAmount: number, quantity: number, periodStart: number, periodEnd: number, at: number): number {
  const span = periodEnd - periodStart
  if (span <= 0) return 0
  const remaining = Math.min(Math.max(periodEnd - at, 0), span)
  return Math.round((unitAmount * quantity * remaining) / span)
}
