import { QueryTypes, type Transaction } from 'sequelize'
import { canonicalDecimal } from '#shared/decimal-text'
import type { CellDto } from '#shared/types/tables'

/** The two cell tables of two-way versions (migration 1201): given cells and the chosen fill's values. */
export type CellTable = 'version_grid_points' | 'version_grid_fill_points'

const CHUNK = 10_000

/** Writes cells in one statement per 10,000 (NUMERIC from decimal text; an empty d text is the ultimate column). */
export async function insertCells(versionId: string, cells: CellDto[], t: Transaction, table: CellTable = 'version_grid_points'): Promise<void> {
  for (let i = 0; i < cells.length; i += CHUNK) {
    const part = cells.slice(i, i + CHUNK)
    await useDb().query(
      `INSERT INTO ${table} (version_id, x, d, y)
       SELECT $versionId, x::numeric, nullif(d, '')::numeric, y::numeric
       FROM unnest(string_to_array($xs, ','), string_to_array($ds, ','), string_to_array($ys, ',')) AS c(x, d, y)`,
      { bind: { versionId, xs: part.map(c => c.x).join(','), ds: part.map(c => c.d ?? '').join(','), ys: part.map(c => c.y).join(',') }, transaction: t })
  }
}

/** Cells by x, then d, the ultimate column last, in canonical decimal text. */
export async function readCells(versionId: string, t?: Transaction, table: CellTable = 'version_grid_points'): Promise<CellDto[]> {
  const rows = await useDb().query<{ x: string; d: string | null; y: string }>(
    `SELECT c.x::text AS x, c.d::text AS d, c.y::text AS y FROM ${table} c WHERE c.version_id = :versionId ORDER BY c.x, c.d NULLS LAST`,
    { replacements: { versionId }, type: QueryTypes.SELECT, transaction: t })
  return rows.map(r => ({ x: canonicalDecimal(r.x), d: r.d === null ? null : canonicalDecimal(r.d), y: canonicalDecimal(r.y) }))
}
