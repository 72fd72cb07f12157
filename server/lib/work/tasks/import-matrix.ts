import type { ImportMatrixMapping } from '#shared/schemas/import-matrix'
import type { CellDto, ImportFinding } from '#shared/types/tables'
import { validateMatrix } from '../../import/matrix'
import type { StoredSheet } from '../../import/stored-sheet'
import { gridContentHash } from '../../points-hash'

// A matrix sheet's checks (issue 17), in a worker thread: the stored cells of the mapped columns travel as JSON text.

export interface MatrixPreviewOutput { findings: ImportFinding[], rows: number, blanks: number, cellCount: number, hasUltimate: boolean, sample: CellDto[] }
export interface MatrixValidateOutput { findings: ImportFinding[], cells: CellDto[], hasUltimate: boolean, contentHash: string }

function run(input: { sheetsJson: string, mapping: ImportMatrixMapping }) {
  const sheet = (JSON.parse(input.sheetsJson) as StoredSheet[]).find(s => s.name === input.mapping.sheet)!
  return validateMatrix(sheet, input.mapping)
}

export function previewMatrixTask(input: { sheetsJson: string, mapping: ImportMatrixMapping }): MatrixPreviewOutput {
  const v = run(input)
  return { findings: v.findings, rows: v.rows, blanks: v.blanks, cellCount: v.cells.length, hasUltimate: v.hasUltimate, sample: v.cells.slice(0, 12) }
}

export function validateMatrixTask(input: { sheetsJson: string, mapping: ImportMatrixMapping }): MatrixValidateOutput {
  const v = run(input)
  const blocked = v.findings.some(f => f.severity === 'error')
  return { findings: v.findings, cells: blocked ? [] : v.cells, hasUltimate: v.hasUltimate, contentHash: gridContentHash(v.cells) }
}
