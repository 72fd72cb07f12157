// Text cells are written so no spreadsheet program runs them as a formula (OWASP "CSV injection"):
// a text that starts with = + - @, a tab or a carriage return gets a leading apostrophe. A text that
// itself starts with an apostrophe gets one too, so reading back (drop one leading apostrophe) is exact.
const RISKY = /^[=+\-@\t\r']/

export function escapeText(text: string): string {
  return RISKY.test(text) ? `'${text}` : text
}

export function unescapeText(text: string): string {
  return text.startsWith('\'') ? text.slice(1) : text
}
