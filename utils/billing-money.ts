/** A billing amount in Stripe's minor units as people read it, e.g. 24500 EUR -> "€245.00". */
export function formatBillingAmount(amount: number, currency: string): string {
  return new Intl.NumberFormat('en-GB', { style: 'currency', currency: currency.toUpperCase() }).format(amount / 100)
}
