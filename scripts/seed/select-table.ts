// The demo's invented select table (issue 17): Larkspur Mutual's term assurance select mortality, entry ages 30 to 70 by
// durations 0 to 4 and an ultimate column, given at every fifth entry age (the rows between are blank: to fill).
// INVENTED DATA: an invented Makeham law for the ultimate rates, select factors 0.55 to 0.95 by duration.
import { QueryTypes, type Sequelize, type Transaction } from 'sequelize'
import { D, canonicalDecimal } from '../../shared/decimal-text'
import { gridContentHash } from '../../server/lib/points-hash'
import { appendAuditEvent } from '../../server/services/audit-writer'
import type { SeededPeople } from './people'
import { makehamQx } from './tables'

export const SELECT_ENTRY_AGES = Array.from({ length: 41 }, (_, i) => 30 + i)
export const SELECT_PIVOTS = SELECT_ENTRY_AGES.filter(x => x % 5 === 0)
export const SELECT_DURATIONS = [0, 1, 2, 3, 4]
const FACTORS = ['0.55', '0.65', '0.75', '0.85', '0.95']

/** q at attained age a from the invented ultimate law. */
function ultimateQ(a: number): InstanceType<typeof D> {
  return new D(makehamQx('0.0005', '0.00003', '1.095', [a], 0, 0)[0]!.y)
}

/** Per-unit cells: row x, duration d (null = ultimate, attained age x + 5), rounded to 7 decimals (4 in per mille). */
export function demoSelectCells(): { x: string, d: string | null, y: string }[] {
  return SELECT_PIVOTS.flatMap(x => [
    ...SELECT_DURATIONS.map(d => ({ x: String(x), d: String(d), y: canonicalDecimal(ultimateQ(x + d).mul(FACTORS[d]!).toDecimalPlaces(7)) })),
    { x: String(x), d: null, y: canonicalDecimal(ultimateQ(x + 5).toDecimalPlaces(7)) },
  ])
}

export const SELECT_NAME = 'Term assurance select mortality 2026'

export async function seedSelectTable(db: Sequelize, t: Transaction, people: SeededPeople): Promise<void> {
  const author = 'priya.raman@larkspur.example'
  const orgId = people.orgs['larkspur-mutual']!
  const cells = demoSelectCells()
  const one = async (sql: string, replacements: Record<string, unknown>) => (await db.query<{ id: string }>(sql, { replacements, type: QueryTypes.SELECT, transaction: t }))[0]!.id
  const tableId = await one(`INSERT INTO rate_tables (org_id, name, kind, axis, value_unit, shape, col_axis, col_axis_unit, has_ultimate, description, tags, created_by)
    VALUES (:orgId, :name, 'mortality', 'age', 'per-mille', 'two-way', 'duration', 'years', true, :description, ARRAY['select', 'term assurance']::text[], :by) RETURNING id`,
  { orgId, name: SELECT_NAME, description: 'Select q by age at entry and duration (select period 5 years) with the ultimate rate at attained age entry + 5. Invented data for the demo.', by: people.users[author] })
  await appendAuditEvent(db, { orgId, actorId: people.users[author]!, actorEmail: author, action: 'table.create', objectType: 'rate_table', objectId: tableId, outcome: 'ok', requestId: null, ip: null, detail: { name: SELECT_NAME, shape: 'two-way', demo: true }, at: new Date().toISOString() }, t)
  const hash = gridContentHash(cells)
  const versionId = await one(`INSERT INTO table_versions (org_id, table_id, number, status, author_id, notes, content_hash)
    VALUES (:orgId, :tableId, 1, 'draft', :by, 'Pivotal entry ages from the 2026 select study; the ages between are to fill.', :hash) RETURNING id`,
  { orgId, tableId, by: people.users[author], hash })
  for (const c of cells) {
    await db.query('INSERT INTO version_grid_points (version_id, x, d, y) VALUES (:versionId, :x::numeric, :d::numeric, :y::numeric)', { replacements: { versionId, ...c }, transaction: t })
  }
  await appendAuditEvent(db, { orgId, actorId: people.users[author]!, actorEmail: author, action: 'version.create', objectType: 'table_version', objectId: versionId, outcome: 'ok', requestId: null, ip: null, detail: { tableId, number: 1, cells: cells.length, contentHash: hash, demo: true }, at: new Date().toISOString() }, t)
}
