import { QueryTypes } from 'sequelize'
import type { H3Event } from 'h3'
import type { OrgAccess } from '../utils/auth'
import type { ImportMatrixMapping } from '#shared/schemas/import-matrix'
import type { ImportFinding } from '#shared/types/tables'
import { runTask } from '../lib/work/pool'
import type { MatrixPreviewOutput } from '../lib/work/tasks/import-matrix'
import { loadSheetColumns } from './import-cells'
import { loadImport } from './imports'
import { insertTwoWayTable } from './two-way'
import { describeTable } from './versions'

// A matrix sheet becomes one two-way table (issue 17): preview and create re-check the stored cells of the mapped
// columns in the worker pool with validateMatrix, the same pure rules; create runs in one transaction and deletes the upload.

async function mappedCellsJson(id: string, m: ImportMatrixMapping, colCount: number, t?: Parameters<typeof loadSheetColumns>[3]): Promise<string> {
  if (m.headerRow < 0 || [m.axisColumn, ...m.columns].some(c => c >= colCount)) throw apiError(400, 'invalid-input', 'The header row or a column is outside the sheet.')
  const sheet = await loadSheetColumns(id, m.sheet, [m.axisColumn, ...m.columns], t)
  if (!sheet) throw apiError(400, 'invalid-input', `The upload has no sheet '${m.sheet}'.`)
  return JSON.stringify([sheet])
}

async function nameClash(orgId: string, m: ImportMatrixMapping): Promise<ImportFinding[]> {
  const [row] = await useDb().query<{ name: string }>('SELECT name FROM rate_tables WHERE org_id = :orgId AND lower(name) = lower(:name)', { replacements: { orgId, name: m.name }, type: QueryTypes.SELECT })
  return row ? [{ severity: 'error', code: 'name-taken', sheet: m.sheet, cell: null, row: null, col: null, message: `A table called "${row.name}" already exists; choose another name.` }] : []
}

function sheetColumns(row: Awaited<ReturnType<typeof loadImport>>, m: ImportMatrixMapping): number {
  const s = row.sheet_summary.find(x => x.name === m.sheet)
  if (!s) throw apiError(400, 'invalid-input', `The upload has no sheet '${m.sheet}'.`)
  if (m.headerRow >= s.rowCount) throw apiError(400, 'invalid-input', 'The header row is outside the sheet.')
  return s.colCount
}

export type MatrixPreviewDto = MatrixPreviewOutput & { errors: number, warnings: number }

export async function previewMatrix(access: OrgAccess, id: string, m: ImportMatrixMapping, signal?: AbortSignal): Promise<MatrixPreviewDto> {
  const row = await loadImport(access, id)
  const out = await runTask('previewMatrix', { sheetsJson: await mappedCellsJson(id, m, sheetColumns(row, m)), mapping: m }, { signal })
  const findings = [...await nameClash(access.org.id, m), ...out.findings]
  return { ...out, findings, errors: findings.filter(f => f.severity === 'error').length, warnings: findings.filter(f => f.severity === 'warning').length }
}

export async function commitMatrix(event: H3Event, access: OrgAccess, id: string, m: ImportMatrixMapping, acceptWarnings: boolean, signal?: AbortSignal) {
  const tableId = await inTransaction(async (t) => {
    const row = await loadImport(access, id, { t, lock: true })
    const v = await runTask('validateMatrix', { sheetsJson: await mappedCellsJson(id, m, sheetColumns(row, m), t), mapping: m }, { signal })
    const findings = [...await nameClash(access.org.id, m), ...v.findings]
    const errors = findings.filter(f => f.severity === 'error')
    const warnings = findings.filter(f => f.severity === 'warning')
    if (errors.length) throw apiError(422, 'import-blocked', `${errors.length} problem(s) block the import: ${errors[0]!.message}`, { findings })
    if (warnings.length && !acceptWarnings) throw apiError(409, 'import-warnings', `Accept the ${warnings.length} warning(s) first, or fix them.`, { findings })
    const tableId = await insertTwoWayTable(event, access, {
      name: m.name, kind: m.kind, axis: m.axis, axisUnit: m.axisUnit, colAxis: m.colAxis, colAxisUnit: m.colAxisUnit, hasUltimate: v.hasUltimate,
      valueUnit: m.valueUnit, description: m.description, cells: v.cells,
    }, { importId: id, notes: `Imported from ${row.file_name}, sheet '${m.sheet}' (a matrix).` }, t)
    await useDb().query('DELETE FROM imports WHERE id = :id', { replacements: { id }, transaction: t })
    await audit(event, { orgId: access.org.id, action: 'import.commit', objectType: 'import', objectId: id, detail: { fileName: row.file_name, sheet: m.sheet, tables: [tableId], layout: 'matrix', acceptedWarnings: warnings.map(w => w.message).slice(0, 50) } }, t)
    return tableId
  })
  return describeTable(access.org.id, tableId)
}
