// CSV as RFC 4180 describes it (CRLF line ends, fields quoted when they hold a comma, a quote or a line break), with a
// UTF-8 byte-order mark so spreadsheet programs read names with accents. Text cells that start with = + - @, a tab or a
// carriage return get a leading apostrophe so no spreadsheet program runs them as a formula (OWASP "CSV injection");
// numbers, including negative ones like -0.0125, are written as they are and keep every digit.
export type CsvCell = string | number | null

const NUMBER = /^-?\d+(\.\d+)?$/
const RISKY = /^[=+\-@\t\r]/

export function csvField(value: CsvCell): string {
  if (value === null) return ''
  const text = typeof value === 'number' ? String(value) : NUMBER.test(value) ? value : RISKY.test(value) ? `'${value}` : value
  return /[",\r\n]/.test(text) ? `"${text.replace(/"/g, '""')}"` : text
}

export function csvText(rows: CsvCell[][]): string {
  return `\uFEFF${rows.map(row => row.map(csvField).join(',')).join('\r\n')}\r\n`
}
