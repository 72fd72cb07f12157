import { QueryTypes, type Transaction } from 'sequelize'
import type { PointDto } from '#shared/types/tables'

/** Writes a version's points in one statement per 10,000 points (NUMERIC from decimal text, never floats). */
export async function insertPoints(versionId: string, points: PointDto[], t: Transaction): Promise<void> {
  for (let i = 0; i < points.length; i += 10_000) {
    const slice = points.slice(i, i + 10_000)
    await useDb().query(
      `INSERT INTO version_points (version_id, x, y)
       SELECT :versionId, x::numeric, y::numeric FROM unnest(string_to_array(:xs, ','), string_to_array(:ys, ',')) AS p(x, y)`,
      { replacements: { versionId, xs: slice.map(p => p.x).join(','), ys: slice.map(p => p.y).join(',') }, transaction: t })
  }
}

export async function readPoints(versionId: string, t?: Transaction): Promise<PointDto[]> {
  const rows = await useDb().query<{ x: string; y: string }>(
    'SELECT x::text AS x, y::text AS y FROM version_points WHERE version_id = :versionId ORDER BY version_points.x',
    { replacements: { versionId }, type: QueryTypes.SELECT, transaction: t })
  return rows.map(r => ({ x: trimZeros(r.x), y: trimZeros(r.y) }))
}

function trimZeros(v: string): string {
  if (!v.includes('.')) return v === '-0' ? '0' : v
  const s = v.replace(/0+$/, '').replace(/\.$/, '')
  return s === '-0' ? '0' : s
}
