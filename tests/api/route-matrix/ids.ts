import { ownerDb } from '../helpers'

/** Ids of demo objects of one organisation that route-matrix paths may name. */
export async function lookupIds(slug: string): Promise<Record<string, string>> {
  const [rows] = await ownerDb().query(`
    SELECT 'org' AS key, o.id::text AS id FROM organisations o WHERE o.slug = :slug
    UNION ALL
    SELECT 'table', (SELECT t.id::text FROM rate_tables t JOIN organisations o ON o.id = t.org_id WHERE o.slug = :slug ORDER BY t.name LIMIT 1)
    UNION ALL
    SELECT 'draftTable', (SELECT t.id::text FROM rate_tables t JOIN organisations o ON o.id = t.org_id JOIN table_versions v ON v.table_id = t.id WHERE o.slug = :slug AND v.status = 'draft' ORDER BY t.name, v.number DESC LIMIT 1)
    UNION ALL
    SELECT 'draftNumber', (SELECT v.number::text FROM rate_tables t JOIN organisations o ON o.id = t.org_id JOIN table_versions v ON v.table_id = t.id WHERE o.slug = :slug AND v.status = 'draft' ORDER BY t.name, v.number DESC LIMIT 1)
    UNION ALL
    SELECT 'benchTable', (SELECT t.id::text FROM rate_tables t JOIN organisations o ON o.id = t.org_id WHERE o.slug = :slug AND t.name = 'Pensioner mortality, male')
    UNION ALL
    SELECT 'benchNumber', (SELECT v.number::text FROM rate_tables t JOIN organisations o ON o.id = t.org_id JOIN table_versions v ON v.table_id = t.id WHERE o.slug = :slug AND t.name = 'Pensioner mortality, male' AND v.status = 'draft' ORDER BY v.number DESC LIMIT 1)
    UNION ALL
    SELECT 'analyst', (SELECT u.id::text FROM users u JOIN memberships m ON m.user_id = u.id JOIN organisations o ON o.id = m.org_id WHERE o.slug = :slug AND m.role = 'analyst' ORDER BY u.email LIMIT 1)
  `, { replacements: { slug } })
  return Object.fromEntries((rows as { key: string; id: string | null }[]).filter(r => r.id).map(r => [r.key, r.id!]))
}
