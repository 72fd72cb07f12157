import { ownerDb } from '../helpers'

/** Ids of demo objects of one organisation that route-matrix paths may name. */
export async function lookupIds(slug: string): Promise<Record<string, string>> {
  const [rows] = await ownerDb().query(`
    SELECT 'org' AS key, o.id::text AS id FROM organisations o WHERE o.slug = :slug
    UNION ALL
    SELECT 'table', (SELECT t.id::text FROM rate_tables t JOIN organisations o ON o.id = t.org_id WHERE o.slug = :slug ORDER BY t.name LIMIT 1)
  `, { replacements: { slug } })
  return Object.fromEntries((rows as { key: string; id: string | null }[]).filter(r => r.id).map(r => [r.key, r.id!]))
}
