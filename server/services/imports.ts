import { isUuid } from '#shared/schemas/route-params'
import { QueryTypes, type Transaction } from 'sequelize'
import type { H3Event } from 'h3'
import type { OrgAccess } from '../utils/auth'
import type { ImportMapping } from '#shared/schemas/imports'
import type { ColumnSuggestion, ImportCommitDto, ImportDto, ImportFinding, ImportPreviewDto, ImportSheetDto } from '#shared/types/tables'
import { ImportRefused } from '../lib/import/limits'
import type { guessAxis } from '../lib/import/analyse'
import { runTask } from '../lib/work/pool'
import { insertPointChunks } from './points-store'
import { insertExperience } from './experience-store'
import { GRADUATED_KINDS } from '#shared/schemas/graduation'
import { HEAVY_UPLOAD_BYTES, newRunKey, startRun } from './work/start'
import { importDto, type ImportReadInput, type ImportRow } from './work/kinds/import-read'
import { loadMappedSheet } from './import-cells'

// The import wizard's server side. Parsing an upload is a run (server/services/work/kinds/import-read.ts); describing,
// previewing and validating the stored cells run in the worker pool, so no step walks a large sheet on the request loop.

/** A 4xx the route can send: the refusal's own status and words. */
export function refusal(e: unknown): never {
  if (e instanceof ImportRefused) throw apiError(e.statusCode, 'import-refused', e.message)
  throw e
}

/** Starts reading an upload (sniff, guards, parse) as a run; large files go through the queue. */
export function startImportRead(event: H3Event, access: OrgAccess, fileName: string, data: Buffer, runKey: string = newRunKey()): Promise<{ id: string, runKey: string }> {
  const input: ImportReadInput = { fileName, origin: { requestId: event.context.requestId ?? null, ip: clientAddress(event) } }
  return startRun(access, { kind: 'import-read', runKey, heavy: data.length > HEAVY_UPLOAD_BYTES, input: input as never, bytes: data, total: 1 })
}

/** The caller's own, unexpired import in this organisation (with its cells as JSON text when asked); 404 for anyone else's. */
export async function loadImport(access: OrgAccess, id: string, options: { cells?: boolean, t?: Transaction, lock?: boolean } = {}): Promise<ImportRow & { sheets_json?: string }> {
  if (!isUuid(id)) notFound('upload')
  const [row] = await useDb().query<ImportRow & { sheets_json?: string }>(
    `SELECT id, file_name, file_kind, size_bytes, sheet_summary, created_at, expires_at${options.cells ? ', sheets::text AS sheets_json' : ''} FROM imports
     WHERE id = :id AND org_id = :orgId AND owner_id = :ownerId AND expires_at > now()${options.lock ? ' FOR UPDATE' : ''}`,
    { replacements: { id, orgId: access.org.id, ownerId: access.user.id }, type: QueryTypes.SELECT, transaction: options.t })
  return row ?? notFound('upload (it may have expired; upload the file again)')
}

export async function describeImport(access: OrgAccess, id: string, sheetName?: string, headerRow?: number, signal?: AbortSignal): Promise<ImportDto & { sheet: ImportSheetDto; columns: ColumnSuggestion[]; axis: ReturnType<typeof guessAxis> }> {
  const row = await loadImport(access, id, { cells: true })
  const described = await runTask('describeImport', { sheetsJson: row.sheets_json!, sheetName, headerRow }, { signal })
  return { ...importDto(row), ...described }
}

async function nameClashes(orgId: string, m: ImportMapping, t?: Transaction): Promise<ImportFinding[]> {
  const rows = await useDb().query<{ name: string }>('SELECT name FROM rate_tables WHERE org_id = :orgId AND lower(name) IN (:names)',
    { replacements: { orgId, names: m.columns.map(c => c.name.toLowerCase()) }, type: QueryTypes.SELECT, transaction: t })
  return rows.map(r => ({ severity: 'error' as const, code: 'name-taken', sheet: m.sheet, cell: null, row: null, col: m.columns.find(c => c.name.toLowerCase() === r.name.toLowerCase())!.index, message: `A table called "${r.name}" already exists; choose another name.` }))
}

/** The mapping fits the sheet (checked on the stored summary, before any cell is read). */
function checkShape(row: ImportRow, m: ImportMapping): void {
  const sheet = row.sheet_summary.find(s => s.name === m.sheet)
  if (!sheet) throw apiError(400, 'invalid-input', `The upload has no sheet '${m.sheet}'.`)
  if (m.headerRow >= sheet.rowCount || m.axisColumn >= sheet.colCount || m.columns.some(c => c.index >= sheet.colCount)) {
    throw apiError(400, 'invalid-input', 'The header row or a column is outside the sheet.')
  }
}

/** Only the mapped columns of the chosen sheet, picked out by PostgreSQL (the worker then never parses the whole workbook). */
async function mappedCellsJson(id: string, m: ImportMapping, t?: Transaction): Promise<string> {
  const sheet = await loadMappedSheet(id, m, t)
  if (!sheet) throw apiError(400, 'invalid-input', `The upload has no sheet '${m.sheet}'.`)
  return JSON.stringify([sheet])
}

const severityCount = (findings: ImportFinding[], severity: ImportFinding['severity']) => findings.filter(f => f.severity === severity).length

export async function previewImport(access: OrgAccess, id: string, m: ImportMapping, signal?: AbortSignal): Promise<ImportPreviewDto> {
  checkShape(await loadImport(access, id), m)
  const preview = await runTask('previewImport', { sheetsJson: await mappedCellsJson(id, m), mapping: m }, { signal })
  const findings = [...await nameClashes(access.org.id, m), ...preview.findings]
  return { ...preview, findings, errors: severityCount(findings, 'error'), warnings: severityCount(findings, 'warning') }
}

/** Re-validates (in the pool), then creates one table with a working draft per value column, all in one transaction. */
export async function commitImport(event: H3Event, access: OrgAccess, id: string, m: ImportMapping, acceptWarnings: boolean, signal?: AbortSignal): Promise<ImportCommitDto> {
  return inTransaction(async (t) => {
    const row = await loadImport(access, id, { t, lock: true })
    checkShape(row, m)
    const v = await runTask('validateImport', { sheetsJson: await mappedCellsJson(id, m, t), mapping: m }, { signal })
    const findings = [...await nameClashes(access.org.id, m, t), ...v.findings]
    const errors = findings.filter(f => f.severity === 'error')
    const warnings = findings.filter(f => f.severity === 'warning')
    if (errors.length) throw apiError(422, 'import-blocked', `${errors.length} problem(s) block the import: ${errors[0]!.message}`, { findings })
    if (warnings.length && !acceptWarnings) throw apiError(409, 'import-warnings', `Accept the ${warnings.length} warning(s) first, or fix them.`, { findings })
    const created: ImportCommitDto['tables'] = []
    for (const table of v.tables) {
      const [tr] = await useDb().query<{ id: string }>(
        `INSERT INTO rate_tables (org_id, name, kind, axis, axis_unit, value_unit, compounding, description, tags, created_by)
         VALUES (:orgId, :name, :kind, :axis, :axisUnit, :valueUnit, :compounding, :description, ARRAY['imported']::text[], :userId) RETURNING id`,
        { replacements: { orgId: access.org.id, name: table.name, kind: table.kind, axis: m.axis, axisUnit: m.axisUnit, valueUnit: table.valueUnit, compounding: m.columns.find(c => c.name === table.name)?.compounding ?? 'annual', description: m.description, userId: access.user.id }, type: QueryTypes.SELECT, transaction: t })
      const [vr] = await useDb().query<{ id: string }>(
        `INSERT INTO table_versions (org_id, table_id, number, status, author_id, notes, content_hash)
         VALUES (:orgId, :tableId, 1, 'draft', :userId, :notes, :hash) RETURNING id`,
        { replacements: { orgId: access.org.id, tableId: tr!.id, userId: access.user.id, notes: `Imported from ${row.file_name}, sheet '${m.sheet}'.`, hash: table.contentHash }, type: QueryTypes.SELECT, transaction: t })
      await insertPointChunks(vr!.id, table.chunks, t)
      if (v.experience?.length && GRADUATED_KINDS.includes(table.kind)) await insertExperience(tr!.id, v.experience, t)
      await audit(event, { orgId: access.org.id, action: 'table.create', objectType: 'rate_table', objectId: tr!.id, detail: { name: table.name, kind: table.kind, valueUnit: table.valueUnit, importId: id } }, t)
      await audit(event, { orgId: access.org.id, action: 'version.create', objectType: 'table_version', objectId: vr!.id, detail: { tableId: tr!.id, number: 1, points: table.pointCount, contentHash: table.contentHash, acceptedWarnings: warnings.length } }, t)
      created.push({ id: tr!.id, name: table.name, versionId: vr!.id, number: 1 })
    }
    await useDb().query('DELETE FROM imports WHERE id = :id', { replacements: { id }, transaction: t })
    await audit(event, { orgId: access.org.id, action: 'import.commit', objectType: 'import', objectId: id, detail: { fileName: row.file_name, sheet: m.sheet, tables: created.map(c => c.id), acceptedWarnings: warnings.map(w => w.message).slice(0, 50) } }, t)
    return { tables: created }
  })
}

export async function deleteImport(event: H3Event, access: OrgAccess, id: string): Promise<void> {
  await inTransaction(async (t) => {
    const row = await loadImport(access, id, { t, lock: true })
    await useDb().query('DELETE FROM imports WHERE id = :id', { replacements: { id }, transaction: t })
    await audit(event, { orgId: access.org.id, action: 'import.discard', objectType: 'import', objectId: id, detail: { fileName: row.file_name } }, t)
  })
}
