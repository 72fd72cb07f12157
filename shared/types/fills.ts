// What the fill bench routes answer. The engine's result types are re-exported (types only, no engine code).
import type { CompareResult, Compounding, Diagnostics, MethodListing, MoneyImpact, ResolvedSpec, TransformListing } from '../engine/contract'
import type { TableKind, Axis, VersionStatus } from '../tables'
import type { BenchGrid } from '../schemas/fills'

export type { CompareEntry, CompareResult, Diagnostics, FillResult, MoneyDifference, MoneyFigure, MoneyImpact, ResolvedSpec, Span } from '../engine/contract'
export type { MethodListing, TransformListing }

export interface FillMethodsDto {
  methods: MethodListing[]
  transforms: TransformListing[]
  engineVersion: string
  caution: string
}

export interface CompareResponseDto {
  result: CompareResult
  /** Server time spent in the engine, milliseconds. */
  engineMs: number
  knots: { x: string, y: string }[]
  kind: TableKind
  /** How the curve's spot rates compound (the forward chart uses it). */
  compounding?: Compounding
  axis: Axis
  status: VersionStatus
  lockVersion: number
  pointCount: number
}

/** fill_spec as stored: the engine's resolved spec plus what the bench needs to show and check it. */
export interface StoredFillSpec extends ResolvedSpec {
  bench: { grid: BenchGrid, label: string, pointsHash: string }
}

export interface SavedFillDto {
  versionId: string
  spec: StoredFillSpec
  rationale: string
  diagnostics: Diagnostics
  money: MoneyImpact
  filledBy: { id: string, name: string } | null
  filledAt: string
  pointCount: number
  /** The version's points changed after the fill was saved: the fill no longer matches them. */
  stale: boolean
  /** The points the fill was fitted on: the version's content hash then, and its lock version right after the fill was saved. */
  fittedOn: { contentHash: string | null, lockVersion: number | null }
  /** The settings in words (method, options, scale, grid, precision, engine), as the signed workbook shows them. */
  settings: { label: string, value: string }[]
  lockVersion: number
  points?: { x: string, y: string }[]
}
