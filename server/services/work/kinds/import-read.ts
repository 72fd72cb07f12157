import { QueryTypes } from 'sequelize'
import type { ImportDto, ImportSheetSummary } from '#shared/types/tables'
import { IMPORT_LIMITS } from '~~/server/lib/import/limits'
import { runTask } from '~~/server/lib/work/pool'
import { runActor, runBytes } from '../runs'
import type { RunExecutor } from './index'

export interface ImportReadInput { fileName: string, origin: { requestId: string | null, ip: string | null } }

/**
 * Reads an upload in a worker thread (sniff, zip guard, parse) and stores its cells as an import, with its audit event,
 * in the transaction that ends the run: a run taken over by another node creates the import once.
 */
export const executeImportRead: RunExecutor = async ({ run, signal }) => {
  const { fileName, origin } = run.input as unknown as ImportReadInput
  const data = await runBytes(run)
  const parsed = await runTask('readUpload', { fileName, data }, { signal })
  return async (t) => {
    await useDb().query('DELETE FROM imports WHERE expires_at < now()', { transaction: t })
    const [row] = await useDb().query<{ id: string, created_at: string, expires_at: string }>(
      `INSERT INTO imports (org_id, owner_id, file_name, file_kind, size_bytes, sheets, sheet_summary, expires_at)
       VALUES ($orgId, $ownerId, $fileName, $kind, $size, $sheets::jsonb, $summary::jsonb, now() + make_interval(hours => $hours))
       RETURNING id, created_at, expires_at`,
      { bind: { orgId: run.orgId, ownerId: run.userId, fileName, kind: parsed.kind, size: data.length, sheets: parsed.sheetsJson, summary: JSON.stringify(parsed.sheets), hours: IMPORT_LIMITS.keepHours }, type: QueryTypes.SELECT, transaction: t })
    await audit(null, { orgId: run.orgId, actor: await runActor(run, t), origin, action: 'import.upload', objectType: 'import', objectId: row!.id,
      detail: { fileName, kind: parsed.kind, sizeBytes: data.length, sheets: parsed.sheets.map(s => ({ name: s.name, rows: s.rowCount })) } }, t)
    const dto: ImportDto = importDto({ id: row!.id, file_name: fileName, file_kind: parsed.kind, size_bytes: data.length, sheet_summary: parsed.sheets, created_at: row!.created_at, expires_at: row!.expires_at })
    return JSON.stringify(dto)
  }
}

export interface ImportRow { id: string, file_name: string, file_kind: 'xlsx' | 'csv', size_bytes: number, sheet_summary: ImportSheetSummary[], created_at: string, expires_at: string }

export const importDto = (r: ImportRow): ImportDto => ({
  id: r.id, fileName: r.file_name, fileKind: r.file_kind, sizeBytes: r.size_bytes, sheets: r.sheet_summary,
  createdAt: new Date(r.created_at).toISOString(), expiresAt: new Date(r.expires_at).toISOString(),
})
