import type { ImportMapping } from '#shared/schemas/imports'
import type { ColumnSuggestion, ImportFinding, ImportPreviewDto, ImportSheetDto, ImportSheetSummary } from '#shared/types/tables'
import { guessAxis, proposeHeaderRow, suggestColumns } from '../../import/analyse'
import { readWorkbook, type StoredSheet } from '../../import/read-workbook'
import { validateMapping, type ExperienceRow } from '../../import/validate'
import { suggestMatrix, type MatrixSuggestion } from '../../import/matrix'
import { pointsContentHash } from '../../points-hash'
import { chunkPoints, type PointChunk } from '../point-chunks'

// The import's heavy steps, run in a worker thread. The parsed cells travel as JSON text (imports.sheets), so the
// request's thread never builds or walks the cell arrays of a large upload.

export interface ReadUploadOutput { kind: 'xlsx' | 'csv', sheetsJson: string, sheets: ImportSheetSummary[] }

/** Sniffs, guards and parses an upload; the summary is what the wizard shows of each sheet. */
export async function readUploadTask(input: { fileName: string, data: Uint8Array }): Promise<ReadUploadOutput> {
  const { kind, sheets } = await readWorkbook(input.fileName, Buffer.from(input.data.buffer, input.data.byteOffset, input.data.byteLength))
  return { kind, sheetsJson: JSON.stringify(sheets), sheets: summarise(sheets) }
}

export function summarise(sheets: StoredSheet[]): ImportSheetSummary[] {
  return sheets.map(s => ({ name: s.name, rowCount: s.rows.length, colCount: s.colCount, headerGuess: proposeHeaderRow(s.rows) }))
}

const sheetOf = (sheets: StoredSheet[], name?: string) => sheets.find(s => s.name === name)

export interface DescribeOutput { sheet: ImportSheetDto, columns: ColumnSuggestion[], axis: ReturnType<typeof guessAxis>, matrix: MatrixSuggestion | null }

/** One sheet's first rows, the header row guess, and a role, kind and unit suggested for each column. */
export function describeTask(input: { sheetsJson: string, sheetName?: string, headerRow?: number }): DescribeOutput {
  const sheets = JSON.parse(input.sheetsJson) as StoredSheet[]
  const sheet = sheetOf(sheets, input.sheetName) ?? sheets[0]!
  const guess = proposeHeaderRow(sheet.rows)
  const header = input.headerRow !== undefined && input.headerRow < sheet.rows.length ? input.headerRow : guess
  const columns = suggestColumns(sheet, header)
  const axisCol = columns.find(c => c.role === 'axis')
  return {
    sheet: { name: sheet.name, head: sheet.rows.slice(0, 40).map(r => r.slice(0, sheet.colCount)), rowCount: sheet.rows.length, colCount: sheet.colCount, headerGuess: guess },
    columns,
    axis: guessAxis(axisCol?.header ?? ''),
    matrix: suggestMatrix(sheet),
  }
}

export type PreviewOutput = Omit<ImportPreviewDto, 'errors' | 'warnings'>

/** Every finding of the mapping (without the name clashes, which the request's side looks up) and the rows to show. */
export function previewTask(input: { sheetsJson: string, mapping: ImportMapping }): PreviewOutput {
  const m = input.mapping
  const sheet = sheetOf(JSON.parse(input.sheetsJson) as StoredSheet[], m.sheet)!
  const v = validateMapping(sheet, m)
  const shown = new Set<number>(v.flaggedRows.slice(0, 500))
  for (let r = m.headerRow + 1; r < sheet.rows.length && r <= m.headerRow + 30; r++) shown.add(r)
  const e = m.experience
  // in the sheet's own order (A, B, C, D), as the person sees the file, whatever the mapping's order
  const columns = [m.axisColumn, ...m.columns.map(c => c.index), ...(e ? [e.exposureColumn, ...(e.deathsColumn !== undefined ? [e.deathsColumn] : [])] : [])]
    .sort((a, b) => a - b)
  return {
    bands: v.bands,
    experience: v.experience && { exposures: v.experience.length, deaths: v.experience.filter(r => r.deaths !== null).length },
    findings: v.findings,
    tables: v.tables.map(t => ({ name: t.name, kind: t.kind, valueUnit: t.valueUnit, pointCount: t.points.length, sample: t.points.slice(0, 5) })),
    rows: [...shown].sort((a, b) => a - b).map(r => ({ row: r, cells: columns.map(c => sheet.rows[r]?.[c] ?? null) })),
    columns,
  }
}

export interface ValidatedForInsert { name: string, kind: ImportMapping['columns'][number]['kind'], valueUnit: ImportMapping['columns'][number]['valueUnit'], pointCount: number, contentHash: string, chunks: PointChunk[] }
export interface ValidateOutput { findings: ImportFinding[], tables: ValidatedForInsert[], experience: ExperienceRow[] | null }

/** The same rules as the preview, with each table's points hashed and joined for the INSERT. */
export function validateTask(input: { sheetsJson: string, mapping: ImportMapping }): ValidateOutput {
  const sheet = sheetOf(JSON.parse(input.sheetsJson) as StoredSheet[], input.mapping.sheet)!
  const v = validateMapping(sheet, input.mapping)
  const blocked = v.findings.some(f => f.severity === 'error')
  return {
    findings: v.findings,
    tables: blocked ? [] : v.tables.map(t => ({ name: t.name, kind: t.kind, valueUnit: t.valueUnit, pointCount: t.points.length, contentHash: pointsContentHash(t.points), chunks: chunkPoints(t.points) })),
    experience: blocked ? null : v.experience,
  }
}
