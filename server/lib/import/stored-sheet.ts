/** One sheet as stored in imports.sheets: cell text by 0-based row and column. */
export interface StoredSheet {
  name: string
  rows: (string | null)[][]
  /** "row:col" of cells holding a formula: refused, their cached result may be stale */
  formulas: string[]
  colCount: number
}

/** Drops the empty cells at the end of a row. */
export function trimRow(row: (string | null)[]) {
  while (row.length && (row[row.length - 1] === null || row[row.length - 1] === '')) row.pop()
  return row
}
