import type { SelectCheck, SelectCompareResult, SelectFillResult } from '../engine/contract'
import type { CellDto } from './tables'
import type { WordRow } from '../fill-words'

/** A two-way fill as stored (fill_spec): the engine's spec plus the bench's grid, label, money and the points hash. */
export interface StoredGridSpec extends Omit<SelectFillResult['spec'], never> {
  shape: 'two-way'
  bench: { grid: { x: { from: string, to: string, step: string }, d: { from: string, to: string, step: string } }, label: string, pointsHash: string, money?: { ages?: number[], interest?: string } }
}

export interface SavedGridFillDto {
  versionId: string
  spec: StoredGridSpec
  rationale: string
  checks: SelectCheck[]
  maxKnotDeviation: string
  money: SelectFillResult['money']
  filledBy: { id: string, name: string } | null
  filledAt: string
  cellCount: number
  stale: boolean
  fittedOn: { contentHash: string | null, lockVersion: number | null }
  settings: WordRow[]
  lockVersion: number
  cells?: CellDto[]
}

export type GridCompareDto = SelectCompareResult & { caution: string }
