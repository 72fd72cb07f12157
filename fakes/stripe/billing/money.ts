const ZERO_DECIMAL = new Set(['bif', 'clp', 'djf', 'gnf', 'jpy', 'kmf', 'krw', 'mga', 'pyg', 'rwf', 'ugx', 'vnd', 'vuv', 'xaf', 'xof', 'xpf'])

/** Minor units → display string (`1200`, `usd` → `$12.00`). */
export function formatMoney(amount: number, currency: string): string {
  const digits = ZERO_DECIMAL.has(currency) ? 0 : 2
  const value = amount / 10 ** digits
  try {
    return new Intl.NumberFormat('en-US', { style: 'currency', currency: currency.toUpperCase(), minimumFractionDigits: digits }).format(value)
  } catch {
    return `${value.toFixed(digits)} ${currency.toUpperCase()}`
  }
}

export function formatDate(unix: number): string {
  return new Date(unix * 1000).toLocaleDateString('en-GB', { day: 'numeric', month: 'short', year: 'numeric', timeZone: 'UTC' })
}
