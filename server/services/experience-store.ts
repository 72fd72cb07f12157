import { QueryTypes, type Transaction } from 'sequelize'
import type { GraduationPoint } from '#shared/engine/contract'
import { canonicalDecimal } from '#shared/decimal-text'
import type { ExperienceRow } from '../lib/import/validate'

// The experience behind a table of crude rates (migration 1301): exposure and deaths by axis value, stored once at the
// import and read by the graduate step, which weights by exposure and tests the fit against expected deaths.

/** Stores the rows for a new table in one statement, as cells-store.ts does: decimal texts bound as joined lists. */
export async function insertExperience(tableId: string, rows: ExperienceRow[], t: Transaction): Promise<void> {
  await useDb().query(
    `INSERT INTO table_experience (table_id, x, exposure, deaths)
     SELECT $tableId, x::numeric, e::numeric, nullif(d, '')::numeric
     FROM unnest(string_to_array($xs, ','), string_to_array($es, ','), string_to_array($ds, ',')) AS u(x, e, d)`,
    // deaths not given travel as an empty text, which nullif makes NULL
    { bind: { tableId, xs: rows.map(r => r.x).join(','), es: rows.map(r => r.exposure).join(','), ds: rows.map(r => r.deaths ?? '').join(',') }, transaction: t },
  )
}

/** The graduate step's points: each given point with the exposure and deaths stored for its axis value, when there are any. */
export async function withExperience(tableId: string, points: { x: string, y: string }[]): Promise<GraduationPoint[]> {
  const rows = await useDb().query<{ x: string, exposure: string, deaths: string | null }>(
    `SELECT x::text AS x, exposure::text AS exposure, deaths::text AS deaths FROM table_experience WHERE table_id = :tableId`,
    { replacements: { tableId }, type: QueryTypes.SELECT },
  )
  if (!rows.length) return points
  const byX = new Map(rows.map(r => [canonicalDecimal(r.x), r]))
  return points.map((p) => {
    const e = byX.get(canonicalDecimal(p.x))
    return e ? { ...p, exposure: e.exposure, ...(e.deaths !== null ? { deaths: e.deaths } : {}) } : p
  })
}
