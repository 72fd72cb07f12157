/** Minor units to a display amount, e.g. 24500 EUR -> "€245.00". */
export function formatMinor(amount: number, currency: string): string {
  return new Intl.NumberFormat('en-GB', { style: 'currency', currency: currency.toUpperCase() }).format(amount / 100)
}
