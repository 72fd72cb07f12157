import type { GraduationRecord } from './graduation'
import type { Compounding } from '../engine/contract'
import type { Axis, AxisUnit, ColAxis, Shape, TableKind, ValueUnit, VersionStatus } from '../tables'

export interface PointDto { x: string; y: string } // stored per-unit decimals as strings
/** A cell of a two-way table: row x, column d (null: the ultimate column), per-unit value y. */
export interface CellDto { x: string; d: string | null; y: string }

export interface VersionSummaryDto {
  id: string
  number: number
  status: VersionStatus
  author: { id: string; name: string } | null
  notes: string
  contentHash: string
  lockVersion: number
  pointCount: number
  createdAt: string
  updatedAt: string
  /** Made by the graduate step: from which version, how (the engine's spec) and why. */
  graduation: GraduationRecord | null
}

/** `cells` are a two-way version's given cells (empty for a one-way table, whose `points` are empty for a two-way one). */
export interface VersionDto extends VersionSummaryDto { points: PointDto[]; cells: CellDto[] }

export interface TableDto {
  id: string
  name: string
  kind: TableKind
  axis: Axis
  axisUnit: AxisUnit
  valueUnit: ValueUnit
  /** How the spot rates compound (curve kinds; annual for every other kind). */
  compounding: Compounding
  shape: Shape
  /** The column axis of a two-way table (null for one-way). */
  colAxis: ColAxis | null
  colAxisUnit: AxisUnit | null
  hasUltimate: boolean
  description: string
  tags: string[]
  createdAt: string
  updatedAt: string
  versions: VersionSummaryDto[]
}

export interface ImportFinding {
  severity: 'error' | 'warning'
  code: string
  sheet: string
  /** A1-style address when the finding is about one cell */
  cell: string | null
  row: number | null // 0-based sheet row
  col: number | null // 0-based sheet column
  message: string
}

export interface ImportSheetSummary { name: string; rowCount: number; colCount: number; headerGuess: number }

export interface ImportDto {
  id: string
  fileName: string
  fileKind: 'xlsx' | 'csv'
  sizeBytes: number
  sheets: ImportSheetSummary[]
  createdAt: string
  expiresAt: string
}

/** What a column of a one-way sheet is used as: the axis, values (a new table), the experience behind crude rates, or nothing. */
export type ColumnRole = 'axis' | 'value' | 'exposure' | 'deaths' | 'ignore'
export interface ColumnSuggestion { index: number; header: string; role: ColumnRole; kind: TableKind; valueUnit: ValueUnit; unitReason: string | null }

export interface ImportSheetDto {
  name: string
  /** the first rows, as text, for picking the header row */
  head: (string | null)[][]
  rowCount: number
  colCount: number
  headerGuess: number
}

/** An axis of bands ("55-59") found on import: what was found, the person's answer, and each band's total kept after a split. */
export interface BandSummary {
  count: number
  first: string
  last: string
  /** Widths of the bands in whole years (one width expected). */
  widths: number[]
  answer: { values: 'totals' | 'rates', split: 'sprague' | 'beers' | 'karup-king' } | null
  /** Significant digits of each band's total that a split keeps. */
  digits: number
  /** Per band and column: the total, the sum of its single-year values (added up again exactly), and whether they agree. */
  checks: { column: string, band: string, total: string, sum: string, kept: boolean }[]
}

export interface ImportPreviewDto {
  /** The axis holds bands (null otherwise). */
  bands: BandSummary | null
  findings: ImportFinding[]
  errors: number
  warnings: number
  tables: { name: string; kind: TableKind; valueUnit: ValueUnit; pointCount: number; sample: { x: string; y: string }[] }[]
  /** rows under the header with every mapped cell, for showing and fixing flagged cells */
  rows: { row: number; cells: (string | null)[] }[]
  columns: number[]
  /** The experience columns read (null when none were mapped): at how many axis values an exposure, and deaths too. */
  experience: { exposures: number; deaths: number } | null
}

export interface ImportCommitDto { tables: { id: string; name: string; versionId: string; number: number }[] }

/** A sheet that reads as a matrix (issue 17): its header row, row-axis column, value columns, guessed kind and unit. */
export interface MatrixSuggestion { headerRow: number, axisColumn: number, columns: number[], kind: TableKind, valueUnit: ValueUnit, unitReason: string | null, hasUltimate: boolean }
