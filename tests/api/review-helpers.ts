import { randomBytes } from 'node:crypto'
import { QueryTypes } from 'sequelize'
import { ownerDb } from './helpers'

// Filled drafts made behind the app's back (owner connection) for the review and export tests,
// shaped exactly like the fill bench saves them (migration 0201 columns).
const one = async <T extends object>(sql: string, replacements: Record<string, unknown>) =>
  (await ownerDb().query<T>(sql, { replacements, type: QueryTypes.SELECT }))[0]!

export async function userId(email: string): Promise<string> {
  return (await one<{ id: string }>('SELECT id FROM users WHERE email = :email', { email })).id
}

export async function newTable(orgSlug: string, authorEmail: string): Promise<string> {
  const author = await userId(authorEmail)
  return (await one<{ id: string }>(`INSERT INTO rate_tables (org_id, name, kind, axis, value_unit, created_by)
    SELECT id, :name, 'mortality', 'age', 'per-unit', :author FROM organisations WHERE slug = :slug RETURNING id`,
  { slug: orgSlug, name: `Review test ${randomBytes(4).toString('hex')}`, author })).id
}

/** Adds the next version of a table as a working draft with points and a recorded fill; returns its number. */
export async function filledDraft(tableId: string, authorEmail: string, bump = '0'): Promise<{ number: number; id: string }> {
  const author = await userId(authorEmail)
  const v = await one<{ id: string; number: number }>(`INSERT INTO table_versions (org_id, table_id, number, status, author_id, content_hash)
    SELECT org_id, id, coalesce((SELECT max(number) FROM table_versions WHERE table_id = :tableId), 0) + 1, 'draft', :author, 'test' FROM rate_tables WHERE id = :tableId
    RETURNING id, number`, { tableId, author })
  const points = [['60', '0.01'], ['65', '0.015'], ['70', '0.024']]
  for (const [x, y] of points) await ownerDb().query('INSERT INTO version_points (version_id, x, y) VALUES (:id, :x, :y::numeric + :bump::numeric)', { replacements: { id: v.id, x, y, bump } })
  for (let age = 60; age <= 70; age++) {
    await ownerDb().query('INSERT INTO version_fill_points (version_id, x, y) VALUES (:id, :x, :y)', { replacements: { id: v.id, x: age, y: (0.01 + (age - 60) * 0.0014 + Number(bump)).toFixed(6) } })
  }
  // the content hash of the points, and the fill recorded as fitted on them (kw_points_hash: migration 0701)
  await ownerDb().query(`UPDATE table_versions SET fill_spec = :spec::jsonb, fill_rationale = 'Linear is enough for a test.', fill_diagnostics = '{"knotsReproduced": true}'::jsonb,
    fill_money = :money::jsonb, filled_by = :author, filled_at = now(), content_hash = kw_points_hash(id), fill_points_hash = kw_points_hash(id), fill_lock_version = lock_version WHERE id = :id`,
  { replacements: { id: v.id, author, spec: JSON.stringify({ method: 'linear', options: {}, transform: 'none', precision: 40, grid: { from: '60', to: '70', step: '1' } }), money: JSON.stringify({ basis: 'mortality', available: true, figures: [{ key: 'e65', label: 'e_65', value: bump === '0' ? '17.1' : '17.4' }] }) } })
  return v
}

export async function statusOf(versionId: string): Promise<string> {
  return (await one<{ status: string }>('SELECT status FROM table_versions WHERE id = :versionId', { versionId })).status
}
