import { fitClosure, isClosure, resolveClosureOptions, type ClosureLaw } from './closure'
import { curveMethodScale, isCurveKind, logDiscountTransform, resolveCompounding, spotRateAtZero } from './compounding'
import { quote, roundTo, type Dec, type DecimalCtor } from './decimal'
import { EngineError } from './errors'
import { checkApplicability, extrapolationAdvice } from './applicability'
import { assertInside, evaluateAny, evaluateAscending, type UniformGrid } from './evaluate'
import { resolvePoints, type ResolvedPoints } from './grid'
import { parseKnots, type ParsedKnots } from './knots'
import type { MethodDefinition } from './methods/method'
import { resolveMoneyOptions } from './money-options'
import type { PiecewisePolynomial } from './piecewise'
import { resolvePrecision, workingContext, workingPrecision } from './precision'
import { methodDefinition, resolveOptions } from './registry'
import { TRANSFORMS, type TransformDefinition } from './transforms'
import { EXTRAPOLATION_KINDS, EXTRAPOLATION_RULES, TABLE_KINDS, type ExtrapolationRule, type FillRequest, type Knot, type ResolvedSpec, type TableKind, type TransformId } from './types'
import { ENGINE_VERSION } from './version'


/** A fitted request: what the evaluator, the diagnostics and the money view share. */
export interface FittedRequest {
  spec: ResolvedSpec
  D: DecimalCtor
  def: MethodDefinition
  /** The transform actually applied (log for log-linear). */
  transform: TransformDefinition
  knots: ParsedKnots
  pp: PiecewisePolynomial
  points: ResolvedPoints
  notes: string[]
  /** The old-age closure law (extrapolation gompertz or kannisto), fitted to the given q_x; null for other rules. */
  closure: ClosureLaw | null
}

export interface CoreFill extends FittedRequest {
  /** Output values rounded to the stated precision, in output order. */
  values: Dec[]
  output: Knot[]
}

function pick<T extends string>(value: unknown, allowed: readonly T[], fallback: T, what: string): T {
  if (value === undefined || value === null) return fallback
  if (typeof value === 'string' && (allowed as readonly string[]).includes(value)) return value as T
  throw new EngineError('invalid-request', `Unknown ${what} ${quote(value)}; choose one of ${allowed.join(', ')}.`)
}

const NO_POINTS: ResolvedPoints = { xs: [], grid: null, at: [], ascending: true, noun: 'Point', uniform: null }

/**
 * Resolve, validate and fit: everything up to, not including, evaluation at the output points. `points`: the output
 * points already resolved for this request's precision (compare resolves them once for every method), or null for a refit
 * without points (a check that evaluates where it needs); by default they are resolved here.
 */
export function fitRequest(request: FillRequest, points?: ResolvedPoints | null): FittedRequest {
  if (typeof request !== 'object' || request === null) throw new EngineError('invalid-request', 'The request must be an object.')
  const def = methodDefinition(request.method)
  const precision = resolvePrecision(request.precision)
  const D = workingContext(precision)
  const options = resolveOptions(def, request.options, D)
  const transformId = pick<TransformId>(request.transform, Object.keys(TRANSFORMS) as TransformId[], 'none', 'transform')
  const extrapolation = pick<ExtrapolationRule>(request.extrapolation, EXTRAPOLATION_RULES, 'error', 'extrapolation rule')
  const kind = pick<TableKind>(request.kind, TABLE_KINDS, 'other', 'kind')
  if (!EXTRAPOLATION_KINDS[extrapolation].includes(kind)) {
    throw new EngineError('invalid-request', `Extrapolation '${extrapolation}' applies to ${EXTRAPOLATION_KINDS[extrapolation].join(', ')} tables; this table's kind is '${kind}'.`)
  }
  const compounding = resolveCompounding(request.compounding, kind)
  checkApplicability(def, kind, extrapolation)
  const money = resolveMoneyOptions(D, request.money)
  if (def.scale === 'log' && transformId !== 'none') {
    throw new EngineError('invalid-request', `Method ${def.id} already interpolates ln y; use transform 'none' with it, or method linear with transform 'log'.`)
  }
  const transform = def.scale === 'log-discount'
    ? curveMethodScale(def.id, kind, transformId, compounding)
    : transformId === 'log-discount' ? logDiscountTransform(compounding) : TRANSFORMS[def.scale === 'log' ? 'log' : transformId]
  const knots = parseKnots(D, request.knots)
  if (knots.x.length < def.minPoints) {
    throw new EngineError('too-few-points', `Method ${def.id} needs at least ${def.minPoints} points; ${knots.x.length} ${knots.x.length === 1 ? 'was' : 'were'} given.`)
  }
  const output = points === undefined ? resolvePoints(D, request.grid, request.at) : points ?? NO_POINTS
  const { closure, extrapolationOptions } = resolveClosure(request, extrapolation, kind, knots, D)
  const notes: string[] = []
  let x = knots.x
  const y = knots.y.map((value, i) => {
    if (!transform.accepts(x[i]!, value)) {
      const why = def.scale === 'log' ? `${def.id} needs y > 0` : def.scale === 'log-discount' ? `${def.id} works on ln P(t) and needs ${transform.domain}` : `transform ${transform.id} needs ${transform.domain}`
      throw new EngineError('transform-domain', `Point ${knots.position[i]} (x = ${x[i]!.toString()}): y '${value.toString()}' is outside the domain; ${why}.`, knots.position[i])
    }
    return transform.forward(x[i]!, value)
  })
  if (transform.anchorAtZero && !x[0]!.isZero()) {
    // ln P(0) = 0 by definition (P(0) = 1): anchor the curve there so short terms are interpolated, not extrapolated.
    x = [new D(0), ...x]
    y.unshift(new D(0))
    notes.push(`On the log discount factor scale${def.scale === 'log-discount' ? ` (where ${def.id} works)` : ''}, the point t = 0 with ln P(0) = 0 (P(0) = 1 by definition) was added to the given points.`)
  }
  const resolved = def.calibrate ? def.calibrate(x, y, options, D) : options
  const pp = def.fit(x, y, resolved, D)
  if (pp.closedForm?.notes) notes.push(...pp.closedForm.notes)
  const spec: ResolvedSpec = {
    engineVersion: ENGINE_VERSION,
    method: def.id,
    options: resolved,
    transform: transformId,
    extrapolation,
    extrapolationOptions,
    grid: output.grid,
    at: output.at,
    precision,
    workingPrecision: workingPrecision(precision),
    rounding: 'half-even',
    kind,
    ...(isCurveKind(kind) ? { compounding } : {}),
    money,
    knotCount: knots.x.length,
  }
  return { spec, D, def, transform, knots, pp, points: output, notes, closure }
}

/** The closure law of a gompertz / kannisto request (mortality only), fitted to the given knots; options for no other rule. */
function resolveClosure(request: FillRequest, rule: ExtrapolationRule, kind: TableKind, knots: ParsedKnots, D: DecimalCtor): { closure: ClosureLaw | null, extrapolationOptions: Record<string, string> | null } {
  if (!isClosure(rule)) {
    if (request.extrapolationOptions && Object.keys(request.extrapolationOptions).length) {
      throw new EngineError('invalid-option', `extrapolationOptions apply to the closure rules gompertz and kannisto; extrapolation '${rule}' takes none.`)
    }
    return { closure: null, extrapolationOptions: null }
  }
  const options = resolveClosureOptions(D, request.extrapolationOptions, knots.x[knots.x.length - 1]!)
  return { closure: fitClosure(rule, knots.x, knots.y, options, D), extrapolationOptions: options }
}

/**
 * Values at any points through the one evaluation path: sweep the pieces, map back from the transform, round.
 * Used for the output grid, for re-checking the knots and for the money view's terms.
 */
export function evaluateValues(fitted: FittedRequest, xs: Dec[], ascending = false, uniform: UniformGrid | null = null): Dec[] {
  const { pp, transform, spec } = fitted
  const P = spec.precision
  // without a transform the polynomial's exact value is rounded once, to the stated precision;
  // with one, to the working precision, and the inverse transform's result to the stated precision
  const digits = transform.id === 'none' ? P : spec.workingPrecision
  const raw = pp.closedForm
    ? pp.closedForm.evaluate(xs, digits)
    : ascending ? evaluateAscending(pp, xs, spec.extrapolation, digits, uniform) : evaluateAny(pp, xs, spec.extrapolation, digits)
  if (fitted.closure) closeAbove(fitted.closure, xs, raw, P)
  if (transform.id === 'none') return raw
  const out: Dec[] = new Array<Dec>(xs.length)
  let atZero: Dec | null = null
  for (let k = 0; k < xs.length; k += 1) {
    const x = xs[k]!
    if (fitted.closure && x.gt(fitted.closure.from)) out[k] = raw[k]!
    else if (transform.id === 'log-discount' && x.isZero()) {
      atZero ??= logDiscountAtZero(fitted)
      out[k] = roundTo(atZero, P)
    }
    else {
      out[k] = roundTo(transform.inverse(x, raw[k]!), P)
    }
  }
  return out
}

/** Above the last given age the closure law's q (on the q scale, not the method's), rounded to the stated precision. */
function closeAbove(closure: ClosureLaw, xs: Dec[], values: Dec[], P: number): void {
  for (let k = 0; k < xs.length; k += 1) if (xs[k]!.gt(closure.from)) values[k] = roundTo(closure.q(xs[k]!), P)
}

/** r(0) under log-discount: the given rate if a knot sits at t = 0, else the limit from the slope of ln P at 0. */
function logDiscountAtZero(fitted: FittedRequest): Dec {
  const { knots, pp, spec } = fitted
  if (knots.x[0]!.isZero()) return knots.y[0]!
  // the anchor (0, 0) is the first break, so the slope at 0 is c1 of the first piece (or the closed form's slope)
  const slope = pp.closedForm ? pp.closedForm.derivative(pp.breaks[0]!, 1) : pp.coefs[0]![1] ?? pp.coefs[0]![0]!.times(0)
  return spotRateAtZero(slope, spec.compounding)
}

/** Fit and evaluate at the output points: the hot path (no diagnostics, no money). */
export function fillCore(request: FillRequest, points?: ResolvedPoints): CoreFill {
  const fitted = fitRequest(request, points)
  const { xs, ascending, noun, uniform } = fitted.points
  // under log-discount the anchor at t = 0 is part of the curve, so [0, first knot) counts as inside
  assertInside(fitted.pp, xs, fitted.spec.extrapolation, noun, ascending, extrapolationAdvice(fitted.def))
  const values = evaluateValues(fitted, xs, ascending, uniform)
  const output: Knot[] = new Array<Knot>(xs.length)
  for (let k = 0; k < xs.length; k += 1) output[k] = { x: xs[k]!.toString(), y: values[k]!.toString() }
  return { ...fitted, values, output }
}
