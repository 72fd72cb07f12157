/** Spreadsheet column letters: 0 → A, 25 → Z, 26 → AA. */
export function columnLetter(col: number): string {
  let s = ''
  for (let n = col + 1; n > 0; n = Math.floor((n - 1) / 26)) s = String.fromCharCode(65 + ((n - 1) % 26)) + s
  return s
}
export const cellAddress = (row: number, col: number) => `${columnLetter(col)}${row + 1}`
