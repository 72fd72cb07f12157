import type { H3Event } from 'h3'
import type { KeyObject } from 'node:crypto'
import { QueryTypes, type Transaction } from 'sequelize'
import { isUuid } from '#shared/schemas/route-params'
import { SIGNED_FORMAT, SIGNED_FORMAT_V3, type AnySignedContent, type SignedContent, type SignedHead } from '../lib/signing'
import { runTask } from '../lib/work/pool'
import type { OrgAccess } from '../utils/auth'
import type { ExportVerdictDto } from '#shared/types/exports'
import type { ReadTableSummaryDto } from '#shared/types/read-tokens'
import { activeSigningKey, publicKeysOf } from './signing-keys'
import { findVersion } from './tables'
import { signedHead, type OrgRef } from './audit-anchor'
import { versionRecord } from './version-record'
import { compareWithTrail } from './audit-verify'
import { HEAVY_EXPORT_VALUES, newRunKey, startRun } from './work/start'
import type { ExportRunInput } from './work/kinds/export'

export type { OrgRef } from './audit-anchor'
type Row = Record<string, unknown>
const iso = (v: unknown) => (v ? new Date(v as string).toISOString() : null)
/** The private key as PKCS #8 DER bytes, the form it crosses to a worker thread in. */
export const pkcs8Of = (key: KeyObject) => new Uint8Array(key.export({ format: 'der', type: 'pkcs8' }))

/**
 * The content object of a signed-off (or since withdrawn) version, exactly as it will be signed. `t`: read it all in
 * that transaction (the read API reads it in one snapshot with the stamp of what can still change, signed-bodies.ts).
 */
export async function signedContent(org: OrgRef, tableId: string, number: number, keyId: string, t?: Transaction): Promise<SignedContent> {
  const record = await versionRecord(org, tableId, number, t)
  if (record.version.status !== 'approved' && record.version.status !== 'retired') throw apiError(409, 'not-signed-off', 'Only a signed-off version can be exported with a signature.')
  // a two-way table signs as format 3 (cells as [x, d, y]); one-way tables keep format 2
  if ('cells' in record) return { format: SIGNED_FORMAT_V3, ...record, signedAt: new Date().toISOString(), keyId }
  return { format: SIGNED_FORMAT, ...record, signedAt: new Date().toISOString(), keyId }
}

export const XLSX_TYPE = 'application/vnd.openxmlformats-officedocument.spreadsheetml.sheet'

/**
 * Starts the signed workbook of a signed-off version as a run (versions with many fill values through the queue), after
 * the checks a request answers at once: 404, 409 for a version never signed off, and the organisation's key made if it
 * has none yet (so the run itself only reads keys).
 */
export async function startExport(event: H3Event, access: OrgAccess, tableId: string, number: number, runKey: string = newRunKey()): Promise<{ id: string, runKey: string }> {
  const version = await findVersion(access.org.id, tableId, number)
  if (version.status !== 'approved' && version.status !== 'retired') throw apiError(409, 'not-signed-off', 'Only a signed-off version can be exported with a signature.')
  await activeSigningKey(event, access.org.id)
  const [values] = await useDb().query<{ n: number }>('SELECT (SELECT count(*)::int FROM version_fill_points WHERE version_id = :id) + (SELECT count(*)::int FROM version_grid_fill_points WHERE version_id = :id) AS n', { replacements: { id: version.id }, type: QueryTypes.SELECT })
  const input: ExportRunInput = { tableId, number, origin: { requestId: event.context.requestId ?? null, ip: clientAddress(event) } }
  return startRun(access, { kind: 'export', runKey, heavy: values!.n > HEAVY_EXPORT_VALUES, input: input as never, total: 1 })
}

/**
 * The signed workbook, signed and written in a worker thread (stopped when `signal` aborts), with the audit trail's head
 * signed beside the content (the anchor); the caller audits the download.
 */
export async function buildSignedExport(org: OrgRef, tableId: string, number: number, signal?: AbortSignal): Promise<{ fileName: string, data: Buffer, content: SignedContent, anchor: SignedHead }> {
  const key = await activeSigningKey(null, org.id)
  const content = await signedContent(org, tableId, number, key.kid)
  const anchor = await signedHead(org, 'export', key)
  const built = await runTask('buildExport', { content, pkcs8: pkcs8Of(key.privateKey), x: key.x, anchor }, { signal })
  const data = Buffer.from(built.data.buffer, built.data.byteOffset, built.data.byteLength)
  const safe = content.table.name.replace(/[^A-Za-z0-9 ._-]+/g, '').trim().replace(/\s+/g, '-').slice(0, 80) || 'table'
  return { fileName: `${safe}-v${number}-signed.xlsx`, data, content, anchor }
}

/** Checks an uploaded workbook (read and checked in a worker thread): signature, every cell, and where the version stands now. */
export async function verifyUpload(event: H3Event, access: OrgAccess, fileName: string, data: Buffer, signal?: AbortSignal): Promise<ExportVerdictDto> {
  const verdict = await runTask('verifyExport', { data, keys: await publicKeysOf(access.org.id) }, { signal })
  const base = { fileName, checkedAt: new Date().toISOString() }
  let result: ExportVerdictDto
  if (verdict.kind === 'not-signed') result = { ...base, verdict: 'not-signed', message: verdict.reason }
  else if (verdict.kind === 'unknown-key') result = { ...base, verdict: 'unknown-key', keyId: verdict.keyId, message: `Signed with a key (${verdict.keyId}) that is not one of ${access.org.name}'s signing keys: either another organisation signed it, or it is not genuine.` }
  else if (verdict.kind === 'altered') {
    result = { ...base, verdict: 'altered', keyId: verdict.keyId, message: verdict.reason, differences: verdict.differences.map(d => ({ cell: d.cell, expected: d.expected === null ? null : String(d.expected), found: d.found === null ? null : String(d.found) })), differenceCount: verdict.differenceCount, signed: verdict.content ? summary(verdict.content) : null }
  } else {
    const c = verdict.content
    const [now] = await useDb().query<Row>(`SELECT v.status, v.content_hash, s.number AS superseded_number FROM table_versions v LEFT JOIN table_versions s ON s.id = v.superseded_by
      WHERE v.org_id = :orgId AND v.id = :id`, { replacements: { orgId: access.org.id, id: isUuid(c.version.id) ? c.version.id : '00000000-0000-0000-0000-000000000000' }, type: QueryTypes.SELECT })
    const status = now?.status as string | undefined
    const kind = status === 'approved' ? 'genuine-current' : status === 'retired' ? 'genuine-superseded' : 'genuine-unknown-version'
    const messages = {
      'genuine-current': `Genuine: it matches signed-off version ${c.version.number} of ${c.table.name}, which is still the signed-off version.`,
      'genuine-superseded': now?.superseded_number ? `Genuine, but since superseded: version ${c.version.number} of ${c.table.name} was replaced by version ${now.superseded_number as number}.` : `Genuine, but since withdrawn: version ${c.version.number} of ${c.table.name} is no longer in force.`,
      'genuine-unknown-version': `The signature is genuine, but this organisation no longer holds version ${c.version.number} of ${c.table.name}.`,
    } as const
    // the audit trail's head the file carries (format 2) against the trail now: removed newest events show here
    const anchor = verdict.anchor?.statement
    const trail = anchor?.head && anchor.organisation.slug === access.org.slug ? await compareWithTrail(access.org.id, anchor.head, anchor.statedAt) : null
    result = { ...base, verdict: kind, keyId: verdict.keyId, message: messages[kind], signed: summary(c), supersededBy: (now?.superseded_number as number | null) ?? null, trail }
  }
  await audit(event, { orgId: access.org.id, action: 'export.verify', detail: { fileName, verdict: result.verdict, keyId: 'keyId' in result ? result.keyId : null, version: result.signed?.version ?? null, differences: result.differenceCount ?? 0 } })
  return result
}

function summary(c: AnySignedContent): NonNullable<ExportVerdictDto['signed']> {
  return { tableId: c.table.id, tableName: c.table.name, version: c.version.number, approvedBy: c.approvedBy?.name ?? null, approvedAt: c.approvedAt, signedAt: c.signedAt, points: 'cells' in c ? c.cells.length : c.points.length, values: c.fill?.values.length ?? 0, format: c.format }
}

/** The organisation's tables that have a signed-off version, as the read API lists them (only `tableIds` when given). */
export async function listSignedOffTables(orgId: string, tableIds: string[] | null): Promise<ReadTableSummaryDto[]> {
  const rows = await useDb().query<Row>(`
    SELECT t.id, t.name, t.kind, t.axis, t.axis_unit, t.value_unit, v.number, v.content_hash, v.approved_at, v.fill_spec IS NOT NULL AS filled
    FROM rate_tables t JOIN table_versions v ON v.table_id = t.id AND v.status = 'approved'
    WHERE t.org_id = :orgId ${tableIds ? 'AND t.id IN (:tableIds)' : ''} ORDER BY t.name`, { replacements: { orgId, tableIds }, type: QueryTypes.SELECT })
  return rows.map(r => ({
    id: r.id as string, name: r.name as string, kind: r.kind as string, axis: r.axis as string, axisUnit: r.axis_unit as string, valueUnit: r.value_unit as string,
    signedOff: { number: r.number as number, contentHash: r.content_hash as string, approvedAt: iso(r.approved_at), filled: r.filled as boolean },
  }))
}
