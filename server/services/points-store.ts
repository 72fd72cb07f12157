import { QueryTypes, type Transaction } from 'sequelize'
import { canonicalDecimal } from '#shared/decimal-text'
import type { PointDto } from '#shared/types/tables'
import { chunkPoints, type PointChunk } from '../lib/work/point-chunks'

/** The two point tables: a version's given points and its chosen fill's values (both NUMERIC, x unique per version). */
export type PointTable = 'version_points' | 'version_fill_points'

/** Writes points in one statement per 10,000 (NUMERIC from decimal text, never floats). */
export function insertPoints(versionId: string, points: PointDto[], t: Transaction, table: PointTable = 'version_points'): Promise<void> {
  return insertPointChunks(versionId, chunkPoints(points), t, table)
}

/** The same, from points already joined (by a worker thread: the request loop only hands the text to PostgreSQL). */
export async function insertPointChunks(versionId: string, chunks: PointChunk[], t: Transaction, table: PointTable = 'version_points'): Promise<void> {
  for (const { xs, ys } of chunks) {
    await useDb().query(
      `INSERT INTO ${table} (version_id, x, y)
       SELECT $versionId, x::numeric, y::numeric FROM unnest(string_to_array($xs, ','), string_to_array($ys, ',')) AS p(x, y)`,
      { bind: { versionId, xs, ys }, transaction: t })
  }
}

/** Points in ascending x, in canonical decimal text. */
export async function readPoints(versionId: string, t?: Transaction, table: PointTable = 'version_points'): Promise<PointDto[]> {
  const rows = await useDb().query<{ x: string; y: string }>(
    // order by the NUMERIC column, not the text alias (which would put 100 before 55)
    `SELECT p.x::text AS x, p.y::text AS y FROM ${table} p WHERE p.version_id = :versionId ORDER BY p.x`,
    { replacements: { versionId }, type: QueryTypes.SELECT, transaction: t })
  return rows.map(r => ({ x: canonicalDecimal(r.x), y: canonicalDecimal(r.y) }))
}
