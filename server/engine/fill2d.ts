import { affineFill } from './affine-weights'
import { checkApplicability } from './applicability'
import { exp, quote, roundTo, type Dec, type DecimalCtor } from './decimal'
import { EngineError } from './errors'
import { evaluateAscending, type UniformGrid } from './evaluate'
import { assertAxisInside, parseKnotGrid, parsePairs, resolveAxis, type KnotGrid } from './grid2d'
import { hermitePieces } from './hermite'
import type { MethodDefinition } from './methods/method'
import { GUARD_DIGITS, MAX_PRECISION, MIN_PRECISION, resolvePrecision, workingContext, workingPrecision } from './precision'
import { methodDefinition, resolveOptions } from './registry'
import { TRANSFORMS, type TransformDefinition } from './transforms'
import { CLOSURE_RULES, EXTRAPOLATION_RULES, TABLE_KINDS, type ExtrapolationRule, type Fill2DRequest, type Fill2DResult, type Knot2D, type TableKind, type TransformId } from './types'
import { ENGINE_VERSION } from './version'

/** Transforms that do not depend on the abscissa, so they apply to a two-way table as they do to a column. */
const TRANSFORMS_2D: TransformId[] = ['none', 'log', 'logit', 'cumulative-hazard']

interface Axis { def: MethodDefinition, options: Record<string, string> }

function axisOf(raw: unknown, options: unknown, kind: TableKind, rule: ExtrapolationRule, F: DecimalCtor): Axis {
  const def = methodDefinition(raw)
  if (def.scale === 'log-discount' || def.calibrate) {
    throw new EngineError('not-applicable', `Method ${def.id} fills a curve of one variable and is not offered for two-way fills.`)
  }
  checkApplicability(def, kind, rule)
  return { def, options: resolveOptions(def, options, F) }
}

function pick<T extends string>(value: unknown, allowed: readonly T[], fallback: T, what: string): T {
  if (value === undefined || value === null) return fallback
  if (typeof value === 'string' && (allowed as readonly string[]).includes(value)) return value as T
  throw new EngineError('invalid-request', `Unknown ${what} ${quote(value)}${what === 'transform' ? ' for a two-way fill' : ''}; choose one of ${allowed.join(', ')}.`)
}

/**
 * Fit one line (ascending distinct x, values on the fill's scale) with an axis's method and evaluate it at ascending xs,
 * rounded to `digits`. log-linear works on ln y as in a one-way fill.
 */
function fillLine(axis: Axis, x: Dec[], y: Dec[], xs: Dec[], uniform: UniformGrid | null, rule: ExtrapolationRule, digits: number, F: DecimalCtor): Dec[] {
  if (y.length < axis.def.minPoints) {
    throw new EngineError('too-few-points', `Method ${axis.def.id} needs at least ${axis.def.minPoints} points along an axis; ${y.length} were given.`)
  }
  const onLog = axis.def.scale === 'log'
  if (onLog && y.some(v => !v.gt(0))) throw new EngineError('transform-domain', `Method ${axis.def.id} needs y > 0 along the axis it fills.`)
  const pp = axis.def.fit(x, onLog ? y.map(v => v.ln()) : y, axis.options, F)
  const raw = evaluateAscending(pp, xs, rule, onLog ? F.precision : digits, uniform)
  return onLog ? raw.map(v => roundTo(exp(v), digits)) : raw
}

/**
 * Many lines of the same abscissae by a Hermite method with nonlinear slopes: the values of hermitePieces are affine in the
 * values and the slopes together (de Boor 2001, ch. IV, the cubic Hermite form), so one set of weights on (y, s) fills each
 * line after its slopes, which are the method's own. Null for any other method (or one on ln y).
 */
function hermiteLines(axis: Axis, x: Dec[], xs: Dec[], uniform: UniformGrid | null, rule: ExtrapolationRule, digits: number, F: DecimalCtor): ((y: Dec[]) => Dec[]) | null {
  const slopes = axis.def.hermiteSlopes
  if (!slopes || axis.def.scale === 'log' || x.length < axis.def.minPoints) return null
  const n = x.length
  const weights = affineFill(v => evaluateAscending(hermitePieces(x, v.slice(0, n), v.slice(n)), xs, rule, F.precision, uniform), 2 * n, F, digits)
  return y => weights([...y, ...slopes(x, y)])
}

/**
 * Two-way fill by tensor product (de Boor, A Practical Guide to Splines, 2001, ch. XVII, tensor-product interpolation):
 * along x for every given d, then along d for every wanted x. With the same linear method on both axes (linear, the cubic
 * splines, the quadratic spline) the order does not matter; with a nonlinear one (pchip, akima) it can, and it is always
 * x first. The pass along x is a fill stated at the working precision W (intermediate values keep every guard digit), so
 * it runs in workingContext(W) (precision.ts). The given points are then read back through the same passes.
 */
export function fill2d(request: Fill2DRequest): Fill2DResult {
  const { result, passes } = fill2dCore(request)
  return { ...result, diagnostics: knotCheck(passes) }
}

/** The fill without its check (what the benchmark times as fit and evaluation). */
export function fill2dCore(request: Fill2DRequest): { result: Omit<Fill2DResult, 'diagnostics'>, passes: Passes } {
  if (typeof request !== 'object' || request === null) throw new EngineError('invalid-request', 'The request must be an object.')
  const P = resolvePrecision(request.precision)
  // the pass along x is stated at the working precision W (precision.ts), which must itself be a precision a fill takes
  if (P > MAX_PRECISION - GUARD_DIGITS) {
    throw new EngineError('invalid-request', `Precision must be a whole number of significant digits from ${MIN_PRECISION} to ${MAX_PRECISION - GUARD_DIGITS} for a two-way fill; got ${quote(P)}.`)
  }
  const F = workingContext(workingPrecision(P))
  const kind = pick(request.kind, TABLE_KINDS, 'other', 'kind')
  const rule = pick(request.extrapolation, EXTRAPOLATION_RULES, 'error', 'extrapolation rule')
  if ((CLOSURE_RULES as readonly string[]).includes(rule)) {
    throw new EngineError('not-applicable', `Extrapolation '${rule}' closes a one-way mortality table at old ages; a two-way fill does not take it. Choose 'error', 'flat' or 'linear'.`)
  }
  const transform = TRANSFORMS[pick(request.transform, TRANSFORMS_2D, 'none', 'transform')]
  const perAxis = typeof request.method === 'object' && request.method !== null
  const m = request.method as { x?: { method?: unknown, options?: unknown }, d?: { method?: unknown, options?: unknown } }
  const ax = perAxis ? axisOf(m.x?.method, m.x?.options, kind, rule, F) : axisOf(request.method, request.options, kind, rule, F)
  const ad = perAxis ? axisOf(m.d?.method, m.d?.options, kind, rule, F) : ax
  const grid: KnotGrid = parseKnotGrid(F, request.knots)
  const z = grid.values.map((row, i) => row.map((y, j) => {
    if (!transform.accepts(grid.xs[i]!, y)) {
      throw new EngineError('transform-domain', `The value at x = ${grid.xs[i]!.toString()}, d = ${grid.ds[j]!.toString()} (${y.toString()}) is outside the domain; transform ${transform.id} needs ${transform.domain}.`)
    }
    return transform.forward(grid.xs[i]!, y)
  }))
  const wanted = outputPoints(F, request)
  assertAxisInside(grid.xs, wanted.xs, rule, 'x')
  assertAxisInside(grid.ds, wanted.ds.flat(), rule, 'd')
  const run: Passes = { ax, ad, grid, z, rule, transform, P, F }
  const values = runPasses(run, wanted)
  const xText = wanted.xs.map(x => x.toString())
  const dText = wanted.ds.map(row => row.map(d => d.toString()))
  const points: Knot2D[] = wanted.order.map(([k, j]) => ({ x: xText[k]!, d: dText[k]![j]!, y: values[k]![j]!.toString() }))
  const result: Omit<Fill2DResult, 'diagnostics'> = {
    points,
    spec: {
      engineVersion: ENGINE_VERSION,
      methods: { x: { method: ax.def.id, options: ax.options }, d: { method: ad.def.id, options: ad.options } },
      transform: transform.id,
      extrapolation: rule,
      grid: wanted.grid,
      at: wanted.grid ? null : points.map(p => ({ x: p.x, d: p.d })),
      precision: P,
      workingPrecision: F.precision,
      rounding: 'half-even',
      kind,
      knotCount: { x: grid.xs.length, d: grid.ds.length },
    },
  }
  return { result, passes: run }
}

interface Passes { ax: Axis, ad: Axis, grid: KnotGrid, z: Dec[][], rule: ExtrapolationRule, transform: TransformDefinition, P: number, F: DecimalCtor }

/** Along x for every given d at every wanted x, then along d for every wanted x: values[k][j] at (xs[k], ds[k][j]), rounded to P. */
function runPasses(r: Passes, wanted: Pick<Wanted, 'xs' | 'ds' | 'uniformX' | 'uniformD'>): Dec[][] {
  const { grid, z, rule, transform, P, F } = r
  const inner = workingPrecision(P)
  const columns = grid.ds.map((_, j) => fillLine(r.ax, grid.xs, z.map(row => row[j]!), wanted.xs, wanted.uniformX, rule, inner, F))
  // without a transform the last pass rounds to P itself; with one, its values are mapped back and then rounded
  const plain = transform.id === 'none'
  const digits = plain ? P : inner
  // the same d for every x and a method affine in the data: one set of weights fills every line along d; a Hermite method
  // with nonlinear slopes (PCHIP, Akima) likewise by weights on the values and their slopes, when there are more lines than
  // the weights cost fills
  const sameD = wanted.ds.every(ds => ds === wanted.ds[0])
  const byWeights = sameD && r.ad.def.affine
    ? affineFill(y => fillLine(r.ad, grid.ds, y, wanted.ds[0]!, wanted.uniformD, rule, F.precision, F), grid.ds.length, F, digits)
    : sameD && wanted.xs.length > 2 * grid.ds.length + 1 ? hermiteLines(r.ad, grid.ds, wanted.ds[0]!, wanted.uniformD, rule, digits, F) : null
  return wanted.xs.map((x, k) => {
    const y = columns.map(c => c[k]!)
    const line = byWeights ? byWeights(y) : fillLine(r.ad, grid.ds, y, wanted.ds[k]!, wanted.uniformD, rule, digits, F)
    return plain ? line : line.map(v => roundTo(transform.inverse(x, v), P))
  })
}

interface Wanted {
  /** Distinct wanted x, ascending, and for each the wanted d (distinct, ascending). */
  xs: Dec[]
  ds: Dec[][]
  uniformX: UniformGrid | null
  uniformD: UniformGrid | null
  /** The output in the caller's order, as indices [k, j] into xs and ds[k]. */
  order: [number, number][]
  grid: Fill2DResult['spec']['grid']
}

function outputPoints(F: DecimalCtor, request: Fill2DRequest): Wanted {
  const { grid, at } = request
  if ((grid === undefined || grid === null) === (at === undefined || at === null)) {
    throw new EngineError('invalid-grid', 'Give either a grid on each axis {x, d} or a list of {x, d} points (at), not both and not neither.')
  }
  if (grid) {
    if (typeof grid !== 'object') throw new EngineError('invalid-grid', 'The grid must be {x, d}, each a grid {from, to, step} or a list of points.')
    const x = resolveAxis(F, grid.x, 'x')
    const d = resolveAxis(F, grid.d, 'd')
    const order = x.points.flatMap((_, k) => d.points.map((__, j) => [k, j] as [number, number]))
    return { xs: x.points, ds: x.points.map(() => d.points), uniformX: x.uniform, uniformD: d.uniform, order, grid: { x: x.spec, d: d.spec } }
  }
  const pairs = parsePairs(F, at)
  const byX = new Map<string, { x: Dec, ds: Map<string, Dec> }>()
  for (const p of pairs) {
    const entry = byX.get(p.x.toString()) ?? { x: p.x, ds: new Map<string, Dec>() }
    entry.ds.set(p.d.toString(), p.d)
    byX.set(p.x.toString(), entry)
  }
  const rows = [...byX.values()].sort((a, b) => a.x.cmp(b.x))
  const ds = rows.map(r => [...r.ds.values()].sort((a, b) => a.cmp(b)))
  const index = new Map<string, [number, number]>()
  rows.forEach((r, k) => ds[k]!.forEach((d, j) => index.set(`${r.x.toString()}|${d.toString()}`, [k, j])))
  const order = pairs.map(p => index.get(`${p.x.toString()}|${p.d.toString()}`)!)
  return { xs: rows.map(r => r.x), ds, uniformX: null, uniformD: null, order, grid: null }
}

/** Every given point read back through the same two passes, against its value rounded to the stated precision. */
function knotCheck(r: Passes): Fill2DResult['diagnostics'] {
  const { grid, P } = r
  const back = runPasses(r, { xs: grid.xs, ds: grid.xs.map(() => grid.ds), uniformX: null, uniformD: null })
  let worst = grid.xs[0]!.times(0)
  grid.values.forEach((row, i) => row.forEach((y, j) => {
    const dev = back[i]![j]!.minus(roundTo(y, P)).abs()
    if (dev.gt(worst)) worst = dev
  }))
  const notes = [`Filled along x first (for each of the ${grid.ds.length} given d), then along d.`]
  if (r.rule !== 'error') notes.push(`Points outside the given values of an axis were extrapolated by rule '${r.rule}' along that axis.`)
  return { maxKnotDeviation: roundTo(worst, P).toString(), knotsReproduced: worst.isZero(), notes }
}
