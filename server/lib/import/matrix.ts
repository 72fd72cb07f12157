import { canonicalDecimal, cmpDecimal, parseNumberText, toPerUnit } from '#shared/decimal-text'
import { checkAxis, checkValue } from '#shared/table-rules'
import type { ImportMatrixMapping } from '#shared/schemas/import-matrix'
import type { CellDto, ImportFinding, MatrixSuggestion } from '#shared/types/tables'
import { sortCells } from '../points-hash'
import { cellAddress, columnLetter, guessKind, guessUnit } from './analyse'
import type { StoredSheet } from './stored-sheet'

// A matrix sheet: row axis values down one column, column axis values across the header row, an ultimate column
// recognised by its heading ("Ult", "Ultimate", "Ult."); blank cells are the cells to fill. Pure: run in a worker thread.

/** "Ult", "Ult.", "Ultimate", "ultimate rate": the ultimate column's heading. */
export const ULTIMATE_HEADING = /^\s*ult(\.|imate)?\b/i

/** The column value a heading names: "0", "1", "Duration 2", "d=3", "Year 4"; "ult" for the ultimate column; null otherwise. */
export function headingValue(text: string | null | undefined): string | 'ult' | null {
  if (!text) return null
  if (ULTIMATE_HEADING.test(text)) return 'ult'
  const m = /^\s*(?:[a-z][a-z ._=]*?\s*)?(\d+(?:\.\d+)?)\s*$/i.exec(text)
  return m ? canonicalDecimal(m[1]!) : null
}

export type { MatrixSuggestion }

/** The header row is the first (of 40) with a non-number in column A and two or more durations or "Ult" to its right; the unit from the notes and values. */
export function suggestMatrix(sheet: StoredSheet): MatrixSuggestion | null {
  for (let r = 0; r < Math.min(sheet.rows.length, 40); r += 1) {
    const row = sheet.rows[r] ?? []
    // a header's first cell names the rows ("Age at entry") or is empty; a number there means a row of data
    if (row[0] && parseNumberText(row[0]).ok) continue
    const columns = row.map((t, c) => (c > 0 && headingValue(t) !== null ? c : -1)).filter(c => c > 0)
    if (columns.length < 2) continue
    const notes = sheet.rows.slice(0, r + 1).flat().filter((t): t is string => !!t).join(' ')
    const values = sheet.rows.slice(r + 1, r + 501).flatMap(rw => columns.map(c => rw[c])).filter((v): v is string => !!v && v.trim() !== '')
    const kind = guessKind(notes)
    const unit = guessUnit(notes, values, kind === 'other' ? 'mortality' : kind)
    return { headerRow: r, axisColumn: 0, columns, kind, valueUnit: unit.unit, unitReason: unit.reason, hasUltimate: columns.some(c => headingValue(row[c]) === 'ult') }
  }
  return null
}

export interface MatrixValidation { findings: ImportFinding[], cells: CellDto[], hasUltimate: boolean, rows: number, blanks: number }

const MAX_FINDINGS = 1000

/** Every rule of a matrix import on the stored cells plus the person's fixes; the cells it would create, sorted. */
export function validateMatrix(sheet: StoredSheet, m: ImportMatrixMapping): MatrixValidation {
  const findings: ImportFinding[] = []
  const formulas = new Set(sheet.formulas)
  const add = (severity: ImportFinding['severity'], code: string, row: number | null, col: number | null, text: string) => {
    if (findings.length >= MAX_FINDINGS) return
    const cell = row !== null && col !== null ? cellAddress(row, col) : null
    findings.push({ severity, code, sheet: sheet.name, cell, row, col, message: `Sheet '${sheet.name}'${cell ? ` ${cell}` : ''}: ${text}` })
  }
  const textAt = (r: number, c: number): string | null => {
    const edit = m.edits[`${r}:${c}`]
    const v = edit !== undefined ? edit : sheet.rows[r]?.[c]
    return v === undefined || v === null || v.trim() === '' ? null : v
  }
  const isFormula = (r: number, c: number) => m.edits[`${r}:${c}`] === undefined && formulas.has(`${r}:${c}`)
  const formulaText = 'is a formula; formulas are refused because the stored result may be stale. Replace it with its value.'
  // the headings: each column's d, once; at most one ultimate column
  const cols: { index: number, d: string | null }[] = []
  const seenD = new Map<string, number>()
  for (const c of m.columns) {
    const h = headingValue(textAt(m.headerRow, c))
    if (h === null) { add('error', 'heading', m.headerRow, c, `the heading '${textAt(m.headerRow, c) ?? ''}' names neither a ${m.colAxis} nor the ultimate column; write a number (0, 1, 2...) or "Ult"`); continue }
    const key = h === 'ult' ? 'ult' : h
    if (seenD.has(key)) { add('error', 'duplicate-heading', m.headerRow, c, `${h === 'ult' ? 'a second ultimate column' : `${m.colAxis} ${h} appears again`} (first in column ${columnLetter(seenD.get(key)!)})`); continue }
    seenD.set(key, c)
    cols.push({ index: c, d: h === 'ult' ? null : h })
  }
  const cells: CellDto[] = []
  const seenX = new Map<string, number>()
  let rows = 0
  let blanks = 0
  for (let r = m.headerRow + 1; r < sheet.rows.length; r += 1) {
    const axisText = textAt(r, m.axisColumn)
    if (axisText === null && cols.every(c => textAt(r, c.index) === null)) continue
    if (isFormula(r, m.axisColumn)) { add('error', 'formula', r, m.axisColumn, formulaText); continue }
    const p = axisText === null ? null : parseNumberText(axisText)
    // a notes row under the table: text in the axis column and nothing in the value columns
    if (p && !p.ok && cols.every(c => textAt(r, c.index) === null)) continue
    if (!p) { add('error', 'axis-blank', r, m.axisColumn, `the ${m.axis} is blank but the row has values`); continue }
    if (!p.ok) { add('error', 'not-a-number', r, m.axisColumn, `'${axisText}' ${p.reason}`); continue }
    const x = canonicalDecimal(p.value)
    const rule = checkAxis(x)
    if (rule?.severity === 'error' || p.scale !== 1) { add('error', 'axis-range', r, m.axisColumn, `'${axisText}': ${rule?.message ?? 'a row axis value cannot be a percentage'}`); continue }
    if (seenX.has(x)) { add('error', 'duplicate-axis', r, m.axisColumn, `${m.axis} ${x} appears again (first in row ${seenX.get(x)! + 1})`); continue }
    seenX.set(x, r)
    rows += 1
    for (const c of cols) {
      if (isFormula(r, c.index)) { add('error', 'formula', r, c.index, formulaText); continue }
      const t = textAt(r, c.index)
      if (t === null) { blanks += 1; continue }
      const v = parseNumberText(t)
      if (!v.ok) { add('error', 'not-a-number', r, c.index, `'${t}' ${v.reason}`); continue }
      const y = toPerUnit(v, m.valueUnit)
      const vr = checkValue(m.kind, y)
      if (vr) add(vr.severity, 'out-of-range', r, c.index, `'${t}' (${y} per unit): ${vr.message}`)
      if (!vr || vr.severity === 'warning') cells.push({ x, d: c.d, y })
    }
  }
  if (!rows) add('error', 'no-rows', null, null, 'there are no rows under the header row')
  else if (!cells.some(c => c.d !== null)) add('error', 'no-points', null, null, `no given values in the ${m.colAxis} columns`)
  rectangleWarning(cells, add, seenX, cols)
  return { findings, cells: sortCells(cells), hasUltimate: cols.some(c => c.d === null), rows, blanks }
}

/** A tensor-product fill needs the given select cells on full rows and columns: the first hole among them is named. */
function rectangleWarning(cells: CellDto[], add: (s: 'warning', code: string, r: number, c: number, t: string) => void, rowOf: Map<string, number>, cols: { index: number, d: string | null }[]) {
  const given = cells.filter(c => c.d !== null)
  const xs = [...new Set(given.map(c => c.x))].sort(cmpDecimal)
  const ds = [...new Set(given.map(c => c.d!))].sort(cmpDecimal)
  const have = new Set(given.map(c => `${c.x}|${c.d}`))
  for (const x of xs) {
    for (const d of ds) {
      if (have.has(`${x}|${d}`)) continue
      const col = cols.find(c => c.d === d)!.index
      add('warning', 'not-rectangular', rowOf.get(x)!, col, `blank, while its row and its column have other given values; a two-way fill needs the given values on full rows and columns (fill this cell, or clear its row or column of given values)`)
      return
    }
  }
}
