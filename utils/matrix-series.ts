import { fromPerUnit } from '#shared/decimal-text'
import { ULTIMATE_LABEL, type ValueUnit } from '#shared/tables'
import type { CellDto } from '#shared/types/tables'

type Line = { name: string, points: [number, number][], given: [number, number][] }

/** Column d's name in a chart legend: "Duration 2", or "Ultimate". */
export const columnName = (colLabel: string, d: string | null) => (d === null ? ULTIMATE_LABEL : `${colLabel} ${d}`)

/** One line per column (durations ascending, the ultimate last): the filled values when given, the given cells marked. */
export function matrixLines(given: CellDto[], filled: CellDto[] | null, unit: ValueUnit, colLabel: string): Line[] {
  const num = (c: CellDto): [number, number] => [Number(c.x), Number(fromPerUnit(c.y, unit))]
  const ds = [...new Set([...given, ...(filled ?? [])].map(c => c.d))].sort((a, b) => (a === null ? 1 : b === null ? -1 : Number(a) - Number(b)))
  return ds.map(d => ({
    name: columnName(colLabel, d),
    points: (filled ?? given).filter(c => c.d === d).map(num),
    given: given.filter(c => c.d === d).map(num),
  }))
}

/** The filled table for a heat map: row and column labels, and [column, row, value] triples. */
export function heatCells(filled: CellDto[], unit: ValueUnit) {
  const rows = [...new Set(filled.map(c => c.x))].sort((a, b) => Number(a) - Number(b))
  const ds = [...new Set(filled.map(c => c.d))].sort((a, b) => (a === null ? 1 : b === null ? -1 : Number(a) - Number(b)))
  const cols = ds.map(d => (d === null ? ULTIMATE_LABEL : d))
  const cells = filled.map(c => [ds.indexOf(c.d), rows.indexOf(c.x), Number(fromPerUnit(c.y, unit))] as [number, number, number])
  return { rows, cols, cells }
}
