// Two versions of a table side by side (all values exact decimal strings).
export interface DiffRowDto { x: string; a: string | null; b: string | null; change: 'added' | 'removed' | 'changed' | 'same'; difference: string | null }
export interface DiffSideDto { number: number; status: string; method: string | null; options: Record<string, string>; transform: string | null; precision: number | null; points: number; values: number }
export interface VersionDiffDto {
  a: DiffSideDto
  b: DiffSideDto
  points: { rows: DiffRowDto[]; added: number; removed: number; changed: number; largest: { x: string; difference: string } | null }
  values: { rows: DiffRowDto[]; added: number; removed: number; changed: number; largest: { x: string; difference: string } | null }
  settings: { field: string; a: string; b: string }[]
  money: { key: string; label: string; a: string | null; b: string | null; difference: string | null }[]
}
