import type { OrgAccess } from '../utils/auth'
import { formatUtc } from '#shared/plain-text'
import { STATUS_LABELS, type VersionStatus } from '#shared/tables'
import { EXTRAPOLATION_LABELS } from '#shared/fills'
import { transformWords } from '#shared/fill-words'
import type { CompareInput } from '#shared/schemas/fills'
import { TRANSFORM_LISTING } from '../engine/index'
import { compareCsv, compareSheets, fillCsv, fillSheets, gridCsv, unitsOfRecord } from '../lib/table-files'
import { readableSheetsV3, writeWorkbook } from '../lib/signing'
import { versionRecord } from './version-record'
import type { CompareResponseDto } from '#shared/types/fills'
import { compareJson } from './work/kinds/compare'

// Unsigned working copies to take away before (or besides) sign-off: a version's chosen fill, and a bench comparison.
export type DownloadFormat = 'csv' | 'xlsx'
export interface DownloadFile { fileName: string; contentType: string; data: Buffer | string }
const TYPES = { csv: 'text/csv; charset=utf-8', xlsx: 'application/vnd.openxmlformats-officedocument.spreadsheetml.sheet' }
const safe = (name: string) => name.replace(/[^A-Za-z0-9 ._-]+/g, '').trim().replace(/\s+/g, '-').slice(0, 80) || 'table'

export async function fillDownload(access: OrgAccess, tableId: string, number: number, format: DownloadFormat): Promise<DownloadFile> {
  const r = await versionRecord(access.org, tableId, number)
  const now = new Date().toISOString()
  const status = STATUS_LABELS[r.version.status as VersionStatus] ?? r.version.status
  const what = r.fill ? 'its chosen fill' : 'its given points (no fill is recorded)'
  const banner = r.version.status === 'approved' || r.version.status === 'retired'
    ? `NOT SIGNED OFF (unsigned copy): version ${r.version.number} of ${r.table.name} is ${status}, but this copy, made ${formatUtc(now)}, carries no signature. The signed workbook is the record.`
    : `NOT SIGNED OFF: a working copy of version ${r.version.number} of ${r.table.name} (${status}) and ${what}, made ${formatUtc(now)}. It may still change and has had no second check.`
  const fileName = `${safe(r.table.name)}-v${number}-NOT-SIGNED-OFF.${format}`
  if ('cells' in r) {
    // a two-way table: its sheets as the signed workbook of format 3 has them, or a CSV of matrices (rows down, columns across)
    if (format === 'csv') return { fileName, contentType: TYPES.csv, data: gridCsv(r, banner) }
    return { fileName, contentType: TYPES.xlsx, data: await writeWorkbook(readableSheetsV3(r, [banner], []).map(s => ({ ...s, name: `${s.name}, not signed off`.slice(0, 31) })), now) }
  }
  if (format === 'csv') return { fileName, contentType: TYPES.csv, data: fillCsv(r, banner) }
  return { fileName, contentType: TYPES.xlsx, data: await writeWorkbook(fillSheets(r, banner), now) }
}

/** The comparison is run again (in a worker thread), so the file shows exactly these settings on the points as they are now. */
export async function compareDownload(access: OrgAccess, tableId: string, number: number, input: CompareInput, format: DownloadFormat, signal?: AbortSignal): Promise<DownloadFile> {
  const r = await versionRecord(access.org, tableId, number)
  if ('cells' in r) throw apiError(409, 'wrong-shape', 'This is a two-way table: its comparisons are on the two-way bench.')
  const answer = JSON.parse(await compareJson(access.org.id, tableId, number, input, signal)) as CompareResponseDto
  const now = new Date().toISOString()
  const banner = `NOT SIGNED OFF: a comparison of ${answer.result.entries.length} methods on the fill bench for version ${number} of ${r.table.name}, made ${formatUtc(now)}. Nothing here was chosen, checked or signed off.`
  const settings = `Grid ${input.grid.from} to ${input.grid.to}, step ${input.grid.step}; interpolated on ${transformWords(TRANSFORM_LISTING, input.transform).toLowerCase()}; outside the given points: ${EXTRAPOLATION_LABELS[input.extrapolation].toLowerCase()}.`
  const u = unitsOfRecord(r)
  const fileName = `${safe(r.table.name)}-v${number}-comparison-NOT-SIGNED-OFF.${format}`
  if (format === 'csv') return { fileName, contentType: TYPES.csv, data: compareCsv(answer.result, answer.knots, u, banner, settings) }
  return { fileName, contentType: TYPES.xlsx, data: await writeWorkbook(compareSheets(answer.result, answer.knots, u, banner, settings), now) }
}
