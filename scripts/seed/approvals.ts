import { QueryTypes, type Sequelize, type Transaction } from 'sequelize'
import { appendAuditEvent } from '../../server/services/audit-writer'
import { fill } from '../../server/engine/index'
import type { SeededPeople } from './people'

// Second checks of the demo: every version the table seed marks signed off is recorded as signed off by
// Felix Amari (an actuary who did not make it), and the demo discount curve gets its fill (monthly, from the
// engine) so the auditor can download a signed export. Runs in the seed's transaction, right after seedTables:
// the frozen-version triggers (migration 0401) let the transaction that approved a version still write it.
const CHECKER = 'felix.amari@fenwickrowe.example'
const CURVE = 'Discount curve 2026-09-30'
const MAKER = 'tomas.varga@larkspur.example'

export async function seedApprovals(db: Sequelize, t: Transaction, people: SeededPeople): Promise<void> {
  const checker = people.users[CHECKER]!
  const maker = people.users[MAKER]!
  const q = <T extends object>(sql: string, replacements: Record<string, unknown>) => db.query<T>(sql, { replacements, type: QueryTypes.SELECT, transaction: t })
  const approved = await q<{ id: string; org_id: string; table_id: string; number: number; name: string; author_id: string | null; content_hash: string }>(`
    SELECT v.id, v.org_id, v.table_id, v.number, t.name, v.author_id, v.content_hash FROM table_versions v JOIN rate_tables t ON t.id = v.table_id
    WHERE v.status = 'approved' AND v.approved_by IS NULL AND v.org_id = :org`, { org: people.orgs['larkspur-mutual'] })
  for (const v of approved) {
    if (v.author_id === checker) continue
    const at = (minutes: number) => new Date(Date.now() - minutes * 60_000)
    if (v.name === CURVE) {
      const knots = await q<{ x: string; y: string }>('SELECT x::text AS x, y::text AS y FROM version_points WHERE version_id = :id ORDER BY x', { id: v.id })
      const grid = { from: '0.25', to: '30', step: '1/12' }
      const result = fill({ knots, kind: 'spot-rate', method: 'pchip', options: {}, transform: 'none', extrapolation: 'error', grid })
      const spec = { ...result.spec, bench: { grid, label: 'Monotone cubic (PCHIP)', pointsHash: v.content_hash } }
      await db.query(`UPDATE table_versions SET fill_spec = :spec::jsonb, fill_rationale = :why, fill_diagnostics = :diag::jsonb, fill_money = :money::jsonb,
          filled_by = :maker, filled_at = :filledAt, fill_points_hash = :pointsHash, fill_lock_version = lock_version WHERE id = :id`,
      { replacements: { id: v.id, pointsHash: v.content_hash, spec: JSON.stringify(spec), diag: JSON.stringify(result.diagnostics), money: JSON.stringify(result.money), maker, filledAt: at(50),
        why: 'Monotone cubic keeps the curve between the quoted tenors without overshoot; forwards stay positive (invented demo data).' }, transaction: t })
      for (let i = 0; i < result.points.length; i += 1000) {
        const slice = result.points.slice(i, i + 1000)
        await db.query(`INSERT INTO version_fill_points (version_id, x, y) SELECT :id, x::numeric, y::numeric FROM unnest(string_to_array(:xs, ','), string_to_array(:ys, ',')) AS p(x, y)`,
          { replacements: { id: v.id, xs: slice.map(p => p.x).join(','), ys: slice.map(p => p.y).join(',') }, transaction: t })
      }
    }
    // made an hour ago, filled, submitted and signed off since: the version's own times read in that order
    await db.query('UPDATE table_versions SET created_at = :made, updated_at = :appr, submitted_by = :maker, submitted_at = :sub, approved_by = :checker, approved_at = :appr WHERE id = :id',
      { replacements: { id: v.id, maker: v.author_id ?? maker, made: at(60), sub: at(40), checker, appr: at(30) }, transaction: t })
    await db.query(`INSERT INTO version_comments (org_id, version_id, author_id, kind, body, created_at) VALUES
      (:org, :id, :maker, 'submit', 'Submitted for a second check.', :sub), (:org, :id, :checker, 'approve', 'Checked against the source; signed off.', :appr)`,
    { replacements: { org: v.org_id, id: v.id, maker: v.author_id ?? maker, checker, sub: at(40), appr: at(30) }, transaction: t })
    await appendAuditEvent(db, { orgId: v.org_id, actorId: checker, actorEmail: CHECKER, action: 'version.approve', objectType: 'table_version', objectId: v.id, outcome: 'ok', requestId: null, ip: null, detail: { tableId: v.table_id, number: v.number, demo: true }, at: new Date().toISOString() }, t)
  }
}
