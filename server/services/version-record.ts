import { QueryTypes, type Transaction } from 'sequelize'
import { CURVE_KINDS } from '#shared/engine/contract'
import type { Json, Pair, Person, ReadableRecord, ReadableRecordV3, Triple } from '../lib/signing'
import { FITTED_ON, findVersion } from './tables'
import { readPoints, type PointTable } from './points-store'
import { readCells, type CellTable } from './cells-store'
import type { OrgRef } from './audit-anchor'

// Everything a version's files say about it (a signed export's content, an unsigned download): the table, the version,
// its given points and its chosen fill with what it was fitted on, and the people, read in one query plus the points.
type Row = Record<string, unknown>
const person = (r: Row, p: string): Person | null => (r[`${p}_email`] ? { name: r[`${p}_name`] as string, email: r[`${p}_email`] as string } : null)
const iso = (v: unknown) => (v ? new Date(v as string).toISOString() : null)

async function pointsOf(table: PointTable, versionId: string, t?: Transaction): Promise<Pair[]> {
  return (await readPoints(versionId, t, table)).map(p => [p.x, p.y])
}

async function triplesOf(table: CellTable, versionId: string, t?: Transaction): Promise<Triple[]> {
  return (await readCells(versionId, t, table)).map(c => [c.x, c.d, c.y])
}

const PEOPLE = ['au:author_id', 'fb:filled_by', 'sb:submitted_by', 'ab:approved_by'].map((s) => {
  const [p, col] = s.split(':')
  return { join: `LEFT JOIN users ${p} ON ${p}.id = v.${col}`, cols: `${p}.name AS ${p}_name, ${p}.email AS ${p}_email` }
})

/**
 * The record of version `number` of the organisation's table (any state), points in ascending order of the axis; `t`:
 * read in that transaction (one snapshot).
 */
export async function versionRecord(org: OrgRef, tableId: string, number: number, t?: Transaction): Promise<ReadableRecord | ReadableRecordV3> {
  const { id } = await findVersion(org.id, tableId, number, { transaction: t })
  const [r] = await useDb().query<Row>(`
    SELECT v.*, ${FITTED_ON} AS fitted_on, t.name AS table_name, t.kind, t.axis, t.axis_unit, t.value_unit, t.compounding, t.shape, t.col_axis, t.col_axis_unit, t.has_ultimate, ${PEOPLE.map(p => p.cols).join(', ')}
    FROM table_versions v JOIN rate_tables t ON t.id = v.table_id ${PEOPLE.map(p => p.join).join(' ')}
    WHERE v.id = :id`,
  { replacements: { id }, type: QueryTypes.SELECT, transaction: t })
  if (!r) notFound('version')
  const fillCommon = r.fill_spec
    ? {
        spec: r.fill_spec as Json, rationale: (r.fill_rationale as string | null) ?? '', checks: (r.fill_diagnostics as Json) ?? null, money: (r.fill_money as Json) ?? null,
        filledBy: person(r, 'fb'), filledAt: iso(r.filled_at),
        fittedOn: { contentHash: (r.fitted_on as string | null) ?? null, lockVersion: (r.fill_lock_version as number | null) ?? null },
      }
    : null
  const common = {
    organisation: { slug: org.slug, name: org.name },
    table: { id: tableId, name: r.table_name as string, kind: r.kind as string, axis: r.axis as string, axisUnit: r.axis_unit as string, valueUnit: r.value_unit as string, ...((CURVE_KINDS as readonly string[]).includes(r.kind as string) ? { compounding: r.compounding as string } : {}) },
    version: { id, number, status: r.status as string, contentHash: r.content_hash as string, notes: r.notes as string },
    madeBy: person(r, 'au'),
    submittedBy: person(r, 'sb'),
    submittedAt: iso(r.submitted_at),
    approvedBy: person(r, 'ab'),
    approvedAt: iso(r.approved_at),
  }
  if (r.shape === 'two-way') {
    // a two-way table (issue 17): cells and values as [x, d, y], the column axis named (signed as format 3)
    return {
      ...common,
      table: { ...common.table, shape: 'two-way', colAxis: r.col_axis as string, colAxisUnit: r.col_axis_unit as string, hasUltimate: r.has_ultimate as boolean },
      cells: await triplesOf('version_grid_points', id, t),
      fill: fillCommon ? { ...fillCommon, values: await triplesOf('version_grid_fill_points', id, t) } : null,
    }
  }
  return { ...common, points: await pointsOf('version_points', id, t), fill: fillCommon ? { ...fillCommon, values: await pointsOf('version_fill_points', id, t) } : null }
}
