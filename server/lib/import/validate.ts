import { canonicalDecimal, cmpDecimal, parseNumberText, toPerUnit } from '#shared/decimal-text'
import { checkAxis, checkValue } from '#shared/table-rules'
import { AXIS_LABELS } from '#shared/tables'
import type { ImportMapping } from '#shared/schemas/imports'
import type { ImportFinding, PointDto } from '#shared/types/tables'
import { cellAddress } from './analyse'
import type { StoredSheet } from './read-workbook'
import { parseBand, type Band } from '#shared/bands'
import type { BandSummary } from '#shared/types/tables'
import { resolveBands, type BandValue } from './bands'

export interface ValidatedTable { name: string; column: number; kind: ImportMapping['columns'][number]['kind']; valueUnit: ImportMapping['columns'][number]['valueUnit']; points: PointDto[] }
/** The experience at one axis value (per-unit decimals as given): exposure > 0, deaths >= 0 or null when not given. */
export interface ExperienceRow { x: string; exposure: string; deaths: string | null }
export interface Validation { findings: ImportFinding[]; tables: ValidatedTable[]; flaggedRows: number[]; bands: BandSummary | null; experience: ExperienceRow[] | null }

const MAX_FINDINGS = 1000
const FORMULA = 'is a formula; formulas are refused because the stored result may be stale. Replace it with its value.'

export function sortPoints<T extends { x: string }>(points: T[]): T[] {
  return points.map(p => ({ p, x: canonicalDecimal(p.x) })).sort((a, b) => cmpDecimal(a.x, b.x)).map(e => e.p)
}

/**
 * Every rule of the import, on the stored cells plus the person's fixes, one row at a time: `checkRow` for each row under
 * the header, then `finish`. Pure; run at preview and again at create (validateMapping, in a worker thread).
 */
function createValidator(sheet: StoredSheet, m: ImportMapping) {
  const findings: ImportFinding[] = []
  const flagged = new Set<number>()
  const formulas = new Set(sheet.formulas)
  const where = `Sheet '${sheet.name}'`
  const add = (severity: ImportFinding['severity'], code: string, row: number | null, col: number | null, text: string) => {
    if (row !== null) flagged.add(row)
    if (findings.length === MAX_FINDINGS) findings.push({ severity: 'error', code: 'too-many', sheet: sheet.name, cell: null, row: null, col: null, message: `${where}: more than ${MAX_FINDINGS} findings; fix the first ones and check again.` })
    if (findings.length > MAX_FINDINGS) return
    const cell = row !== null && col !== null ? cellAddress(row, col) : null
    findings.push({ severity, code, sheet: sheet.name, cell, row, col, message: `${where}${cell ? ` ${cell}` : ''}: ${text}` })
  }
  const cellAt = (r: number, c: number): { text: string | null; formula: boolean } => {
    const edit = m.edits[`${r}:${c}`]
    if (edit !== undefined) return { text: edit.trim() === '' ? null : edit, formula: false }
    const v = sheet.rows[r]?.[c]
    return { text: v === undefined || v === null || v.trim() === '' ? null : v, formula: formulas.has(`${r}:${c}`) }
  }
  const axisName = AXIS_LABELS[m.axis].toLowerCase()
  const tables: ValidatedTable[] = m.columns.map(c => ({ name: c.name, column: c.index, kind: c.kind, valueUnit: c.valueUnit, points: [] }))
  const firstRowOf = new Map<string, number>()
  let previous: string | null = null
  let unsortedReported = false
  let dataRows = 0
  // an axis of bands ("55-59"): the values of each column by band, resolved in finish (resolveBands)
  let bandRows = 0
  const banded: BandValue[][] = m.columns.map(() => [])
  const experience: ExperienceRow[] = []

  /** An exposure or a deaths count: a plain number (no percentage), at least 0 (an exposure more than 0); null when blank. */
  const count = (r: number, c: number, what: 'exposure' | 'deaths'): string | null | undefined => {
    const cell = cellAt(r, c)
    if (cell.formula) { add('error', 'formula', r, c, FORMULA); return undefined }
    if (cell.text === null) return null
    const p = parseNumberText(cell.text)
    if (!p.ok) { add('error', 'not-a-number', r, c, `'${cell.text}' ${p.reason}`); return undefined }
    const low = what === 'exposure' ? cmpDecimal(p.value, '0') <= 0 : cmpDecimal(p.value, '0') < 0
    if (p.scale !== 1 || low) { add('error', 'experience-invalid', r, c, `'${cell.text}': ${what === 'exposure' ? 'an exposure is a number of lives or years lived, more than 0' : 'deaths are a count, 0 or more'}`); return undefined }
    return canonicalDecimal(p.value)
  }
  const checkExperience = (r: number, x: string) => {
    const e = m.experience!
    const exposure = count(r, e.exposureColumn, 'exposure')
    const deaths = e.deathsColumn === undefined ? null : count(r, e.deathsColumn, 'deaths')
    if (exposure === null) add('warning', 'exposure-blank', r, e.exposureColumn, `no exposure at ${axisName} ${x}; graduation gives it weight 1`)
    if (deaths === null && e.deathsColumn !== undefined) add('warning', 'deaths-blank', r, e.deathsColumn, `no deaths at ${axisName} ${x}; the test against expected deaths needs them at every ${axisName}`)
    if (exposure) experience.push({ x, exposure, deaths: deaths ?? null })
  }

  const checkRow = (r: number) => {
    const axisCell = cellAt(r, m.axisColumn)
    const valueCells = m.columns.map(c => cellAt(r, c.index))
    if (axisCell.text === null && valueCells.every(v => v.text === null)) return // blank row
    dataRows++
    let x: string | null = null
    const band: Band | null = axisCell.formula ? null : parseBand(axisCell.text)
    if (band) {
      bandRows++
      const first = firstRowOf.get(band.from)
      if (first !== undefined) add('error', 'duplicate-axis', r, m.axisColumn, `the band ${axisCell.text} appears again (first in row ${first + 1})`)
      else { firstRowOf.set(band.from, r); x = band.from }
    }
    else if (axisCell.formula) add('error', 'formula', r, m.axisColumn, FORMULA)
    else if (axisCell.text === null) add('error', 'axis-blank', r, m.axisColumn, `the ${axisName} is blank but the row has values`)
    else {
      const p = parseNumberText(axisCell.text)
      if (!p.ok) add('error', 'not-a-number', r, m.axisColumn, `'${axisCell.text}' ${p.reason}`)
      else if (p.scale !== 1) add('error', 'axis-unit', r, m.axisColumn, `'${axisCell.text}': the ${axisName} cannot be a percentage`)
      else {
        const rule = checkAxis(p.value)
        if (rule) add(rule.severity, 'axis-range', r, m.axisColumn, `'${axisCell.text}': ${rule.message}`)
        const key = canonicalDecimal(p.value)
        const first = firstRowOf.get(key)
        if (first !== undefined) add('error', 'duplicate-axis', r, m.axisColumn, `${axisName} ${key} appears again (first in row ${first + 1})`)
        else firstRowOf.set(key, r)
        if (previous !== null && cmpDecimal(key, previous) < 0 && !unsortedReported) {
          unsortedReported = true
          add('warning', 'unsorted', r, m.axisColumn, `the rows are not in increasing order of ${axisName} (first here); they will be sorted when the drafts are created`)
        }
        previous = key
        if (!rule || rule.severity === 'warning') x = first === undefined ? key : null
      }
    }
    if (m.experience && x !== null && !band) checkExperience(r, x)
    m.columns.forEach((col, i) => {
      const cell = valueCells[i]!
      if (cell.formula) return add('error', 'formula', r, col.index, FORMULA)
      if (cell.text === null) return add('warning', 'value-blank', r, col.index, `no value; this row is left out of "${col.name}"`)
      const p = parseNumberText(cell.text)
      if (!p.ok) return add('error', 'not-a-number', r, col.index, `'${cell.text}' ${p.reason}`)
      const y = toPerUnit(p, col.valueUnit)
      // totals of a band (deaths, exposures) have no range rule of their own; rates do
      const rule = band && m.bands?.values === 'totals' ? null : checkValue(col.kind, y)
      if (rule) add(rule.severity, 'out-of-range', r, col.index, `'${cell.text}' (${y} per unit): ${rule.message}`)
      if (x === null || (rule && rule.severity !== 'warning')) return
      if (band) banded[i]!.push({ band, value: y, row: r })
      else tables[i]!.points.push({ x, y })
    })
  }
  const finish = (): Validation => {
    if (dataRows === 0) add('error', 'no-rows', null, null, 'there are no rows under the header row')
    let bands: BandSummary | null = null
    if (bandRows > 0) {
      if (tables.some(t => t.points.length)) add('error', 'bands-mixed', null, m.axisColumn, `the ${axisName} column mixes bands (like 55-59) with single values; use one or the other`)
      const resolved = resolveBands(m, banded, add)
      tables.forEach((t, i) => { t.points = sortPoints(resolved.points[i]!) })
      bands = resolved.summary
    }
    for (const t of tables) {
      // a band column already says why it has no points (the question, or the split's refusal)
      const explained = bands !== null && (bands.answer === null || findings.some(f => f.col === t.column && f.severity === 'error'))
      if (dataRows > 0 && t.points.length === 0 && !explained) add('error', 'no-points', null, t.column, `"${t.name}" has no usable values`)
      else if (t.points.length === 1) add('warning', 'one-point', null, t.column, `"${t.name}" has a single point; interpolation needs at least two`)
      if (unsortedReported) t.points = sortPoints(t.points)
    }
    return { findings, tables, flaggedRows: [...flagged].sort((a, b) => a - b), bands, experience: m.experience ? sortPoints(experience) : null }
  }
  return { firstRow: m.headerRow + 1, endRow: sheet.rows.length, checkRow, finish }
}

/** Every rule of the import at once (tests, benchmarks). */
export function validateMapping(sheet: StoredSheet, m: ImportMapping): Validation {
  const v = createValidator(sheet, m)
  for (let r = v.firstRow; r < v.endRow; r++) v.checkRow(r)
  return v.finish()
}
