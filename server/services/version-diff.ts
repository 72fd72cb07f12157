import { QueryTypes } from 'sequelize'
import { D, canonicalDecimal } from '#shared/decimal-text'
import type { DiffRowDto, DiffSideDto, VersionDiffDto } from '#shared/types/diff'
import { findTable, findVersion } from './tables'
import { readPoints, type PointTable } from './points-store'
import { specRows, type SpecLike } from '#shared/fill-words'
import { METHODS, TRANSFORM_LISTING } from '../engine/index'

// Two versions of one table compared exactly (decimal.js): given points, filled values, fill settings, money view.
type Row = Record<string, unknown>
interface Side { dto: DiffSideDto; spec: Record<string, unknown> | null; money: { figures?: { key: string; label: string; value: string | null }[] } | null; points: Map<string, string>; values: Map<string, string> }

async function load(orgId: string, tableId: string, number: number): Promise<Side> {
  const { id } = await findVersion(orgId, tableId, number)
  const [v] = await useDb().query<Row>('SELECT id, number, status, fill_spec, fill_money FROM table_versions WHERE id = :id', { replacements: { id }, type: QueryTypes.SELECT })
  if (!v) notFound('version')
  const read = async (table: PointTable) => new Map((await readPoints(id, undefined, table)).map(p => [p.x, p.y] as const))
  const spec = (v.fill_spec as Record<string, unknown> | null) ?? null
  const points = await read('version_points')
  const values = await read('version_fill_points')
  return {
    spec, points, values, money: (v.fill_money as Side['money']) ?? null,
    dto: { number: v.number as number, status: v.status as string, method: (spec?.method as string) ?? null, options: (spec?.options as Record<string, string>) ?? {}, transform: (spec?.transform as string) ?? null, precision: (spec?.precision as number) ?? null, points: points.size, values: values.size },
  }
}

function compareMaps(a: Map<string, string>, b: Map<string, string>) {
  const xs = [...new Set([...a.keys(), ...b.keys()])].sort((p, q) => new D(p).cmp(new D(q)))
  let largest: { x: string; difference: string } | null = null
  const rows: DiffRowDto[] = xs.map((x) => {
    const va = a.get(x) ?? null
    const vb = b.get(x) ?? null
    if (va === null) return { x, a: va, b: vb, change: 'added', difference: null }
    if (vb === null) return { x, a: va, b: vb, change: 'removed', difference: null }
    const d = new D(vb).minus(va)
    if (!d.isZero() && (!largest || d.abs().gt(new D(largest.difference).abs()))) largest = { x, difference: canonicalDecimal(d) }
    return { x, a: va, b: vb, change: d.isZero() ? 'same' : 'changed', difference: canonicalDecimal(d) }
  })
  const n = (c: DiffRowDto['change']) => rows.filter(r => r.change === c).length
  return { rows, added: n('added'), removed: n('removed'), changed: n('changed'), largest }
}

/** The fill settings of both sides in words (shared/fill-words.ts), row by row, where they differ. */
function settingsDiff(A: Side, B: Side): VersionDiffDto['settings'] {
  const rows = (side: Side) => new Map((side.spec ? specRows(side.spec as unknown as SpecLike, METHODS, TRANSFORM_LISTING) : []).filter(r => r.label !== 'Engine version').map(r => [r.label, r.value]))
  const [ra, rb] = [rows(A), rows(B)]
  return [...new Set([...ra.keys(), ...rb.keys()])].map(field => ({ field, a: ra.get(field) ?? '—', b: rb.get(field) ?? '—' })).filter(s => s.a !== s.b)
}

export async function diffVersions(orgId: string, tableId: string, a: number, b: number): Promise<VersionDiffDto> {
  await findTable(orgId, tableId)
  const [A, B] = [await load(orgId, tableId, a), await load(orgId, tableId, b)]
  const settings = settingsDiff(A, B)
  const figures = new Map<string, { label: string; a: string | null; b: string | null }>()
  for (const f of A.money?.figures ?? []) figures.set(f.key, { label: f.label, a: f.value, b: null })
  for (const f of B.money?.figures ?? []) figures.set(f.key, { label: f.label, a: figures.get(f.key)?.a ?? null, b: f.value })
  const money = [...figures].map(([key, f]) => ({ key, ...f, difference: f.a !== null && f.b !== null ? canonicalDecimal(new D(f.b).minus(f.a)) : null }))
  return { a: A.dto, b: B.dto, points: compareMaps(A.points, B.points), values: compareMaps(A.values, B.values), settings, money }
}
