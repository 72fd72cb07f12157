import { isUuid } from '#shared/schemas/route-params'
import { QueryTypes, type Transaction } from 'sequelize'
import type { H3Event } from 'h3'
import type { OrgAccess } from '../utils/auth'
import type { ImportMapping } from '#shared/schemas/imports'
import type { ColumnSuggestion, ImportCommitDto, ImportDto, ImportFinding, ImportPreviewDto, ImportSheetDto } from '#shared/types/tables'
import { IMPORT_LIMITS, ImportRefused } from '../lib/import/limits'
import { readWorkbook, type StoredSheet } from '../lib/import/read-workbook'
import { guessAxis, proposeHeaderRow, suggestColumns } from '../lib/import/analyse'
import { validateMapping, type Validation } from '../lib/import/validate'
import { pointsContentHash } from '../lib/points-hash'
import { insertPoints } from './points-store'

type Row = Record<string, unknown>
interface ImportRow { id: string; file_name: string; file_kind: 'xlsx' | 'csv'; size_bytes: number; sheets: StoredSheet[]; created_at: string; expires_at: string }

/** A 4xx the route can send: the refusal's own status and words. */
export function refusal(e: unknown): never {
  if (e instanceof ImportRefused) throw apiError(e.statusCode, 'import-refused', e.message)
  throw e
}

const toDto = (r: ImportRow): ImportDto => ({
  id: r.id, fileName: r.file_name, fileKind: r.file_kind, sizeBytes: r.size_bytes,
  sheets: r.sheets.map(s => ({ name: s.name, rowCount: s.rows.length, colCount: s.colCount, headerGuess: proposeHeaderRow(s.rows) })),
  createdAt: new Date(r.created_at).toISOString(), expiresAt: new Date(r.expires_at).toISOString(),
})

/** Parses and checks the upload; only a file that passed every guard gets an imports row. */
export async function createImport(event: H3Event, access: OrgAccess, fileName: string, data: Buffer): Promise<ImportDto> {
  const { kind, sheets } = await readWorkbook(fileName, data).catch(refusal)
  return inTransaction(async (t) => {
    await useDb().query('DELETE FROM imports WHERE expires_at < now()', { transaction: t })
    const [row] = await useDb().query<ImportRow>(
      `INSERT INTO imports (org_id, owner_id, file_name, file_kind, size_bytes, sheets, expires_at)
       VALUES (:orgId, :ownerId, :fileName, :kind, :size, :sheets::jsonb, now() + make_interval(hours => :hours))
       RETURNING id, file_name, file_kind, size_bytes, sheets, created_at, expires_at`,
      { replacements: { orgId: access.org.id, ownerId: access.user.id, fileName, kind, size: data.length, sheets: JSON.stringify(sheets), hours: IMPORT_LIMITS.keepHours }, type: QueryTypes.SELECT, transaction: t })
    await audit(event, { orgId: access.org.id, action: 'import.upload', objectType: 'import', objectId: row!.id, detail: { fileName, kind, sizeBytes: data.length, sheets: sheets.map(s => ({ name: s.name, rows: s.rows.length })) } }, t)
    return toDto(row!)
  })
}

/** The caller's own, unexpired import in this organisation; 404 for anyone else's. */
async function loadImport(access: OrgAccess, id: string, t?: Transaction, lock = false): Promise<ImportRow> {
  if (!isUuid(id)) notFound('upload')
  const [row] = await useDb().query<ImportRow>(
    `SELECT id, file_name, file_kind, size_bytes, sheets, created_at, expires_at FROM imports
     WHERE id = :id AND org_id = :orgId AND owner_id = :ownerId AND expires_at > now()${lock ? ' FOR UPDATE' : ''}`,
    { replacements: { id, orgId: access.org.id, ownerId: access.user.id }, type: QueryTypes.SELECT, transaction: t })
  return row ?? notFound('upload (it may have expired; upload the file again)')
}

export async function describeImport(access: OrgAccess, id: string, sheetName?: string, headerRow?: number): Promise<ImportDto & { sheet: ImportSheetDto; columns: ColumnSuggestion[]; axis: ReturnType<typeof guessAxis> }> {
  const row = await loadImport(access, id)
  const sheet = row.sheets.find(s => s.name === sheetName) ?? row.sheets[0]!
  const guess = proposeHeaderRow(sheet.rows)
  const header = headerRow !== undefined && headerRow < sheet.rows.length ? headerRow : guess
  const columns = suggestColumns(sheet, header)
  const axisCol = columns.find(c => c.role === 'axis')
  return {
    ...toDto(row),
    sheet: { name: sheet.name, head: sheet.rows.slice(0, 40).map(r => r.slice(0, sheet.colCount)), rowCount: sheet.rows.length, colCount: sheet.colCount, headerGuess: guess },
    columns,
    axis: guessAxis(axisCol?.header ?? ''),
  }
}

async function nameClashes(orgId: string, m: ImportMapping, t?: Transaction): Promise<ImportFinding[]> {
  const rows = await useDb().query<{ name: string }>('SELECT name FROM rate_tables WHERE org_id = :orgId AND lower(name) IN (:names)',
    { replacements: { orgId, names: m.columns.map(c => c.name.toLowerCase()) }, type: QueryTypes.SELECT, transaction: t })
  return rows.map(r => ({ severity: 'error' as const, code: 'name-taken', sheet: m.sheet, cell: null, row: null, col: m.columns.find(c => c.name.toLowerCase() === r.name.toLowerCase())!.index, message: `A table called "${r.name}" already exists; choose another name.` }))
}

async function check(access: OrgAccess, row: ImportRow, m: ImportMapping, t?: Transaction): Promise<Validation> {
  const sheet = row.sheets.find(s => s.name === m.sheet)
  if (!sheet) throw apiError(400, 'invalid-input', `The upload has no sheet '${m.sheet}'.`)
  const width = sheet.colCount
  if (m.headerRow >= sheet.rows.length || m.axisColumn >= width || m.columns.some(c => c.index >= width)) {
    throw apiError(400, 'invalid-input', 'The header row or a column is outside the sheet.')
  }
  const v = validateMapping(sheet, m)
  v.findings.unshift(...await nameClashes(access.org.id, m, t))
  return v
}

export async function previewImport(access: OrgAccess, id: string, m: ImportMapping): Promise<ImportPreviewDto> {
  const row = await loadImport(access, id)
  const v = await check(access, row, m)
  const sheet = row.sheets.find(s => s.name === m.sheet)!
  const shown = new Set<number>(v.flaggedRows.slice(0, 500))
  for (let r = m.headerRow + 1; r < sheet.rows.length && r <= m.headerRow + 30; r++) shown.add(r)
  const columns = [m.axisColumn, ...m.columns.map(c => c.index)]
  return {
    findings: v.findings,
    errors: v.findings.filter(f => f.severity === 'error').length,
    warnings: v.findings.filter(f => f.severity === 'warning').length,
    tables: v.tables.map(t => ({ name: t.name, kind: t.kind, valueUnit: t.valueUnit, pointCount: t.points.length, sample: t.points.slice(0, 5) })),
    rows: [...shown].sort((a, b) => a - b).map(r => ({ row: r, cells: columns.map(c => sheet.rows[r]?.[c] ?? null) })),
    columns,
  }
}

/** Re-validates, then creates one table with a working draft per value column, all in one transaction. */
export async function commitImport(event: H3Event, access: OrgAccess, id: string, m: ImportMapping, acceptWarnings: boolean): Promise<ImportCommitDto> {
  return inTransaction(async (t) => {
    const row = await loadImport(access, id, t, true)
    const v = await check(access, row, m, t)
    const errors = v.findings.filter(f => f.severity === 'error')
    const warnings = v.findings.filter(f => f.severity === 'warning')
    if (errors.length) throw apiError(422, 'import-blocked', `${errors.length} problem(s) block the import: ${errors[0]!.message}`, { findings: v.findings })
    if (warnings.length && !acceptWarnings) throw apiError(409, 'import-warnings', `Accept the ${warnings.length} warning(s) first, or fix them.`, { findings: v.findings })
    const created: ImportCommitDto['tables'] = []
    for (const table of v.tables) {
      const [tr] = await useDb().query<Row>(
        `INSERT INTO rate_tables (org_id, name, kind, axis, axis_unit, value_unit, description, tags, created_by)
         VALUES (:orgId, :name, :kind, :axis, :axisUnit, :valueUnit, :description, ARRAY['imported']::text[], :userId) RETURNING id`,
        { replacements: { orgId: access.org.id, name: table.name, kind: table.kind, axis: m.axis, axisUnit: m.axisUnit, valueUnit: table.valueUnit, description: m.description, userId: access.user.id }, type: QueryTypes.SELECT, transaction: t })
      const hash = pointsContentHash(table.points)
      const [vr] = await useDb().query<Row>(
        `INSERT INTO table_versions (org_id, table_id, number, status, author_id, notes, content_hash)
         VALUES (:orgId, :tableId, 1, 'draft', :userId, :notes, :hash) RETURNING id`,
        { replacements: { orgId: access.org.id, tableId: tr!.id, userId: access.user.id, notes: `Imported from ${row.file_name}, sheet '${m.sheet}'.`, hash }, type: QueryTypes.SELECT, transaction: t })
      await insertPoints(vr!.id as string, table.points, t)
      await audit(event, { orgId: access.org.id, action: 'table.create', objectType: 'rate_table', objectId: tr!.id as string, detail: { name: table.name, kind: table.kind, valueUnit: table.valueUnit, importId: id } }, t)
      await audit(event, { orgId: access.org.id, action: 'version.create', objectType: 'table_version', objectId: vr!.id as string, detail: { tableId: tr!.id, number: 1, points: table.points.length, contentHash: hash, acceptedWarnings: warnings.length } }, t)
      created.push({ id: tr!.id as string, name: table.name, versionId: vr!.id as string, number: 1 })
    }
    await useDb().query('DELETE FROM imports WHERE id = :id', { replacements: { id }, transaction: t })
    await audit(event, { orgId: access.org.id, action: 'import.commit', objectType: 'import', objectId: id, detail: { fileName: row.file_name, sheet: m.sheet, tables: created.map(c => c.id), acceptedWarnings: warnings.map(w => w.message).slice(0, 50) } }, t)
    return { tables: created }
  })
}

export async function deleteImport(event: H3Event, access: OrgAccess, id: string): Promise<void> {
  await inTransaction(async (t) => {
    const row = await loadImport(access, id, t, true)
    await useDb().query('DELETE FROM imports WHERE id = :id', { replacements: { id }, transaction: t })
    await audit(event, { orgId: access.org.id, action: 'import.discard', objectType: 'import', objectId: id, detail: { fileName: row.file_name } }, t)
  })
}
