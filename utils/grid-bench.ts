// The two-way bench's settings and the request they make (pure helpers, auto-imported).
import type { ExtrapolationRule, MethodListing, TransformListing } from '#shared/engine/contract'
import { extrapolationRulesFor } from '#shared/fills'
import type { TableKind } from '#shared/tables'
import type { SavedGridFillDto } from '#shared/types/grid-fills'
import type { GridCompareInput } from '#shared/schemas/grid-fills'
import type { CellDto } from '#shared/types/tables'

export interface AxisGrid { from: string, to: string, step: string }
export interface GridChoice { x: string, d: string }
type GridTransform = GridCompareInput['transform']
export interface GridBenchSettings { x: AxisGrid, d: AxisGrid, ages: string, interest: string, transform: GridTransform, extrapolation: ExtrapolationRule, choices: GridChoice[] }

/** The transforms a two-way fill takes (the engine's fill2d: not the discount curve's ln P). */
export function twoWayTransforms(transforms: TransformListing[]): (TransformListing & { id: GridTransform })[] {
  return transforms.filter((t): t is TransformListing & { id: GridTransform } => t.id !== 'log-discount')
}

/** The extrapolation rules a two-way fill takes for this kind: no old-age closure (a one-way rule) and no own extension. */
export function twoWayRules(kind: TableKind): ExtrapolationRule[] {
  return extrapolationRulesFor(kind).filter(r => r === 'error' || r === 'flat' || r === 'linear')
}

/** Methods a two-way fill takes: those of the table's kind, without the curve methods (they fill one variable). */
export function twoWayMethods(methods: MethodListing[], kind: string): MethodListing[] {
  return methods.filter(m => m.appliesTo.kinds.includes(kind as never) && m.id !== 'monotone-convex' && m.id !== 'smith-wilson')
}

/** Whole steps over the given rows and select columns; money at two entry ages among the given rows. */
export function defaultGridSettings(cells: CellDto[], saved: SavedGridFillDto | null): GridBenchSettings {
  const xs = cells.map(c => Number(c.x))
  const ds = cells.filter(c => c.d !== null).map(c => Number(c.d))
  const rows = [...new Set(xs)].sort((a, b) => a - b)
  const g = saved?.spec.bench.grid
  const choice = saved ? [{ x: saved.spec.select.methods.x.method, d: saved.spec.select.methods.d.method }] : []
  return {
    x: g?.x ?? { from: String(Math.min(...xs)), to: String(Math.max(...xs)), step: '1' },
    d: g?.d ?? { from: String(Math.min(...ds)), to: String(Math.max(...ds)), step: '1' },
    ages: (saved?.spec.bench.money?.ages ?? rows.slice(1, 3)).join(', '),
    interest: '3',
    transform: (saved?.spec.select.transform ?? 'none') as GridTransform,
    extrapolation: saved?.spec.select.extrapolation ?? 'error',
    choices: [...choice, { x: 'linear', d: 'linear' }, { x: 'cubic-natural', d: 'linear' }, { x: 'pchip', d: 'pchip' }]
      .filter((c, i, all) => all.findIndex(o => o.x === c.x && o.d === c.d) === i).slice(0, 3),
  }
}

/** The request the settings make; interest typed in percent; each choice named in words ("Natural cubic spline × Linear"). */
export function gridCompareBody(s: GridBenchSettings, methods: MethodListing[]): GridCompareInput {
  const words = (id: string) => methods.find(m => m.id === id)?.label ?? id
  const ages = s.ages.split(/[,\s]+/).filter(Boolean).map(Number).filter(Number.isInteger)
  const interest = s.interest.trim() ? String(Number(s.interest) / 100) : undefined
  return {
    grid: { x: s.x, d: s.d }, transform: s.transform, extrapolation: s.extrapolation,
    choices: s.choices.map(c => ({ x: { method: c.x as never }, d: { method: c.d as never }, label: `${words(c.x)} × ${words(c.d)}` })),
    money: ages.length ? { ages, ...(interest ? { interest } : {}) } : undefined,
  }
}
