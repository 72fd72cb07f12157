import { QueryTypes } from 'sequelize'
import { D, canonicalDecimal } from '#shared/decimal-text'
import type { DiffRowDto, DiffSideDto, VersionDiffDto } from '#shared/types/diff'
import { findTable, findVersion } from './tables'
import { readPoints, type PointTable } from './points-store'
import { gridSpecRows, specRows, type GridSpecLike, type SpecLike } from '#shared/fill-words'
import { AXIS_LABELS, COL_AXIS_LABELS, type ColAxis } from '#shared/tables'
import { readCells, type CellTable } from './cells-store'
import { METHODS, TRANSFORM_LISTING } from '../engine/index'

// Two versions of one table compared exactly (decimal.js): given points, filled values, fill settings, money view. For a
// two-way table the rows are its cells, keyed "row / column" ("40 / ultimate" for the ultimate column).
type Row = Record<string, unknown>
interface Side { dto: DiffSideDto; spec: Record<string, unknown> | null; money: { figures?: { key: string; label: string; value: string | null }[] } | null; points: Map<string, string>; values: Map<string, string> }
interface Shape { twoWay: boolean, names: { rows: string, columns: string } }

/** A two-way cell's key in the diff: "40 / 2" (row / column), "40 / ultimate". */
const cellKey = (x: string, d: string | null) => `${x} / ${d ?? 'ultimate'}`
/** Keys in order: by row, then column, the ultimate column last. */
function keyOrder(p: string, q: string): number {
  const [px, pd] = p.split(' / ') as [string, string?]
  const [qx, qd] = q.split(' / ') as [string, string?]
  const byX = new D(px).cmp(new D(qx))
  if (byX || pd === undefined || qd === undefined) return byX
  return pd === qd ? 0 : pd === 'ultimate' ? 1 : qd === 'ultimate' ? -1 : new D(pd).cmp(new D(qd))
}

/** A two-way fill's money figures as the diff lists them (one per entry age). */
function gridMoney(money: unknown): Side['money'] {
  const figures = (money as { figures?: { age: number, selectAnnuity: string | null }[] } | null)?.figures ?? []
  return { figures: figures.map(f => ({ key: `select-adue(${f.age})`, label: `Annuity-due, entry age ${f.age}, select then ultimate`, value: f.selectAnnuity })) }
}

async function load(orgId: string, tableId: string, number: number, shape: Shape): Promise<Side> {
  const { id } = await findVersion(orgId, tableId, number)
  const [v] = await useDb().query<Row>('SELECT id, number, status, fill_spec, fill_money FROM table_versions WHERE id = :id', { replacements: { id }, type: QueryTypes.SELECT })
  if (!v) notFound('version')
  const read = async (table: PointTable) => new Map((await readPoints(id, undefined, table)).map(p => [p.x, p.y] as const))
  const readGrid = async (table: CellTable) => new Map((await readCells(id, undefined, table)).map(c => [cellKey(c.x, c.d), c.y] as const))
  const spec = (v.fill_spec as Record<string, unknown> | null) ?? null
  const points = shape.twoWay ? await readGrid('version_grid_points') : await read('version_points')
  const values = shape.twoWay ? await readGrid('version_grid_fill_points') : await read('version_fill_points')
  const label = shape.twoWay ? ((spec?.bench as { label?: string } | undefined)?.label ?? null) : null
  return {
    spec, points, values, money: shape.twoWay ? gridMoney(v.fill_money) : (v.fill_money as Side['money']) ?? null,
    dto: { number: v.number as number, status: v.status as string, method: label ?? (spec?.method as string) ?? null, options: (spec?.options as Record<string, string>) ?? {}, transform: (spec?.transform as string) ?? null, precision: (spec?.precision as number) ?? null, points: points.size, values: values.size },
  }
}

function compareMaps(a: Map<string, string>, b: Map<string, string>) {
  const xs = [...new Set([...a.keys(), ...b.keys()])].sort(keyOrder)
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
function settingsDiff(A: Side, B: Side, shape: Shape): VersionDiffDto['settings'] {
  const words = (spec: Record<string, unknown>) => (shape.twoWay ? gridSpecRows(spec as unknown as GridSpecLike, METHODS, TRANSFORM_LISTING, shape.names) : specRows(spec as unknown as SpecLike, METHODS, TRANSFORM_LISTING))
  const rows = (side: Side) => new Map((side.spec ? words(side.spec) : []).filter(r => r.label !== 'Engine version').map(r => [r.label, r.value]))
  const [ra, rb] = [rows(A), rows(B)]
  return [...new Set([...ra.keys(), ...rb.keys()])].map(field => ({ field, a: ra.get(field) ?? '—', b: rb.get(field) ?? '—' })).filter(s => s.a !== s.b)
}

export async function diffVersions(orgId: string, tableId: string, a: number, b: number): Promise<VersionDiffDto> {
  const table = await findTable(orgId, tableId)
  const shape: Shape = { twoWay: table.shape === 'two-way', names: { rows: AXIS_LABELS[table.axis].toLowerCase(), columns: table.colAxis ? COL_AXIS_LABELS[table.colAxis as ColAxis].toLowerCase() : '' } }
  const [A, B] = [await load(orgId, tableId, a, shape), await load(orgId, tableId, b, shape)]
  const settings = settingsDiff(A, B, shape)
  const figures = new Map<string, { label: string; a: string | null; b: string | null }>()
  for (const f of A.money?.figures ?? []) figures.set(f.key, { label: f.label, a: f.value, b: null })
  for (const f of B.money?.figures ?? []) figures.set(f.key, { label: f.label, a: figures.get(f.key)?.a ?? null, b: f.value })
  const money = [...figures].map(([key, f]) => ({ key, ...f, difference: f.a !== null && f.b !== null ? canonicalDecimal(new D(f.b).minus(f.a)) : null }))
  return { a: A.dto, b: B.dto, points: compareMaps(A.points, B.points), values: compareMaps(A.values, B.values), settings, money }
}
