import type { H3Event } from 'h3'
import { QueryTypes } from 'sequelize'
import { isUuid } from '#shared/schemas/route-params'
import { SIGNED_FORMAT, canonicalBytes, contentSha256, readWorkbookCells, signatureSheetField, signBytes, verifyWorkbookCells, writeSignedWorkbook, type Json, type Pair, type Person, type SignedContent } from '../lib/signing'
import { guardXlsxZip } from '../lib/import/zip-guard'
import { ImportRefused } from '../lib/import/limits'
import type { OrgAccess } from '../utils/auth'
import type { ExportVerdictDto } from '#shared/types/exports'
import type { ReadTableSummaryDto } from '#shared/types/read-tokens'
import { activeSigningKey, publicKeyById } from './signing-keys'
import { findTable, findVersion } from './tables'
import { readPoints, type PointTable } from './points-store'

type Row = Record<string, unknown>
interface OrgRef { id: string, slug: string, name: string }
const person = (r: Row, p: string): Person | null => (r[`${p}_email`] ? { name: r[`${p}_name`] as string, email: r[`${p}_email`] as string } : null)
const iso = (v: unknown) => (v ? new Date(v as string).toISOString() : null)

async function pointsOf(table: PointTable, versionId: string): Promise<Pair[]> {
  return (await readPoints(versionId, undefined, table)).map(p => [p.x, p.y])
}

/** The content object of a signed-off (or since withdrawn) version, exactly as it will be signed. */
async function signedContent(org: OrgRef, tableId: string, number: number, keyId: string): Promise<SignedContent> {
  const { id } = await findVersion(org.id, tableId, number)
  const people = ['au:author_id', 'fb:filled_by', 'sb:submitted_by', 'ab:approved_by'].map((s) => {
    const [p, col] = s.split(':')
    return { join: `LEFT JOIN users ${p} ON ${p}.id = v.${col}`, cols: `${p}.name AS ${p}_name, ${p}.email AS ${p}_email` }
  })
  const [r] = await useDb().query<Row>(`
    SELECT v.*, t.name AS table_name, t.kind, t.axis, t.axis_unit, t.value_unit, ${people.map(p => p.cols).join(', ')}
    FROM table_versions v JOIN rate_tables t ON t.id = v.table_id ${people.map(p => p.join).join(' ')}
    WHERE v.id = :id`,
  { replacements: { id }, type: QueryTypes.SELECT })
  if (!r) notFound('version')
  if (r.status !== 'approved' && r.status !== 'retired') throw apiError(409, 'not-signed-off', 'Only a signed-off version can be exported with a signature.')
  return {
    format: SIGNED_FORMAT,
    organisation: { slug: org.slug, name: org.name },
    table: { id: tableId, name: r.table_name as string, kind: r.kind as string, axis: r.axis as string, axisUnit: r.axis_unit as string, valueUnit: r.value_unit as string },
    version: { id, number, status: r.status as string, contentHash: r.content_hash as string, notes: r.notes as string },
    points: await pointsOf('version_points', id),
    fill: r.fill_spec
      ? { spec: r.fill_spec as Json, rationale: (r.fill_rationale as string | null) ?? '', checks: (r.fill_diagnostics as Json) ?? null, money: (r.fill_money as Json) ?? null, filledBy: person(r, 'fb'), filledAt: iso(r.filled_at), values: await pointsOf('version_fill_points', id) }
      : null,
    madeBy: person(r, 'au'),
    submittedBy: person(r, 'sb'),
    submittedAt: iso(r.submitted_at),
    approvedBy: person(r, 'ab'),
    approvedAt: iso(r.approved_at),
    signedAt: new Date().toISOString(),
    keyId,
  }
}

export async function exportSignedVersion(event: H3Event, access: OrgAccess, tableId: string, number: number): Promise<{ fileName: string; data: Buffer }> {
  const key = await activeSigningKey(event, access.org.id)
  const content = await signedContent(access.org, tableId, number, key.kid)
  const signature = signBytes(canonicalBytes(content), key.privateKey)
  const data = await writeSignedWorkbook(content, { signature, keyId: key.kid, x: key.x })
  await audit(event, { orgId: access.org.id, action: 'export.download', objectType: 'table_version', objectId: content.version.id, detail: { tableId, number, keyId: key.kid, bytes: data.length, signedAt: content.signedAt } })
  const safe = content.table.name.replace(/[^A-Za-z0-9 ._-]+/g, '').trim().replace(/\s+/g, '-').slice(0, 80) || 'table'
  return { fileName: `${safe}-v${number}-signed.xlsx`, data }
}

/** Checks an uploaded workbook: signature, every cell, and where the version stands now. */
export async function verifyUpload(event: H3Event, access: OrgAccess, fileName: string, data: Buffer): Promise<ExportVerdictDto> {
  if (!(data[0] === 0x50 && data[1] === 0x4b)) throw new ImportRefused(415, 'Upload the .xlsx workbook exactly as Knotwork exported it (this file is not an .xlsx workbook).')
  await guardXlsxZip(data)
  let sheets
  try { sheets = await readWorkbookCells(data) } catch (error) { throw new ImportRefused(422, `The workbook cannot be read: ${(error as Error).message}.`) }
  const keys = new Map<string, string | null>()
  const kid = signatureSheetField(sheets, 'Key id')
  if (kid) keys.set(kid, await publicKeyById(access.org.id, kid))
  const verdict = verifyWorkbookCells(sheets, kid => keys.get(kid) ?? null)
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
    result = { ...base, verdict: kind, keyId: verdict.keyId, message: messages[kind], signed: summary(c), supersededBy: (now?.superseded_number as number | null) ?? null }
  }
  await audit(event, { orgId: access.org.id, action: 'export.verify', detail: { fileName, verdict: result.verdict, keyId: 'keyId' in result ? result.keyId : null, version: result.signed?.version ?? null, differences: result.differenceCount ?? 0 } })
  return result
}

function summary(c: SignedContent): NonNullable<ExportVerdictDto['signed']> {
  return { tableId: c.table.id, tableName: c.table.name, version: c.version.number, approvedBy: c.approvedBy?.name ?? null, approvedAt: c.approvedAt, signedAt: c.signedAt, points: c.points.length, values: c.fill?.values.length ?? 0 }
}

/**
 * A signed-off version as a production system reads it: the same content object an export signs, its Ed25519 signature
 * over the RFC 8785 canonical bytes, and the key id (public keys: /api/keys/<org>.json). Without a number, the version in
 * force; with one, that version if it was ever signed off (in force or since superseded). 404 otherwise.
 * `tag` is the SHA-256 of that content without its signing time (so it covers the key id, the version's state and the
 * table's details): a caller that already holds it (If-None-Match) gets `null` instead of a new payload.
 */
export async function signedOffPayload(event: H3Event, org: OrgRef, tableId: string, options: { number?: number, holds?: string } = {}):
Promise<{ tag: string, payload: { content: SignedContent, signature: string, keyId: string } | null }> {
  await findTable(org.id, tableId)
  const [row] = await useDb().query<{ number: number }>(`SELECT number FROM table_versions WHERE org_id = :orgId AND table_id = :tableId
    AND ${options.number === undefined ? 'status = \'approved\'' : 'number = :number AND status IN (\'approved\', \'retired\')'}`,
  { replacements: { orgId: org.id, tableId, number: options.number ?? null }, type: QueryTypes.SELECT })
  if (!row) notFound(options.number === undefined ? 'signed-off version' : `signed-off version ${options.number}`)
  const key = await activeSigningKey(event, org.id)
  const content = await signedContent(org, tableId, row.number, key.kid)
  const tag = `W/"${contentSha256({ ...content, signedAt: '' })}"`
  if (options.holds?.split(',').map(t => t.trim()).includes(tag)) return { tag, payload: null }
  return { tag, payload: { content, signature: signBytes(canonicalBytes(content), key.privateKey), keyId: key.kid } }
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
