import {
  DEFAULT_PRECISION, GUARD_DIGITS, MAX_PRECISION, MIN_PRECISION, decimalContext, quote, roundTo, type Dec, type DecimalCtor,
} from './decimal'
import { curveMethodScale, isCurveKind, logDiscountTransform, resolveCompounding, spotRateAtZero } from './compounding'
import { EngineError } from './errors'
import { checkApplicability, extrapolationAdvice } from './applicability'
import { assertInside, evaluateAny, evaluateAscending, type UniformGrid } from './evaluate'
import { resolvePoints, type ResolvedPoints } from './grid'
import { parseKnots, type ParsedKnots } from './knots'
import type { MethodDefinition } from './methods/method'
import { resolveMoneyOptions } from './money-options'
import type { PiecewisePolynomial } from './piecewise'
import { methodDefinition, resolveOptions } from './registry'
import { TRANSFORMS, type TransformDefinition } from './transforms'
import { EXTRAPOLATION_RULES, type ExtrapolationRule, type FillRequest, type Knot, type ResolvedSpec, type TableKind, type TransformId } from './types'
import { ENGINE_VERSION } from './version'

const KINDS: TableKind[] = ['mortality', 'lapse', 'salary', 'spot-rate', 'discount-factor', 'other']
const RULES: readonly ExtrapolationRule[] = EXTRAPOLATION_RULES

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

function resolvePrecision(value: unknown): number {
  if (value === undefined || value === null) return DEFAULT_PRECISION
  if (typeof value !== 'number' || !Number.isInteger(value) || value < MIN_PRECISION || value > MAX_PRECISION) {
    throw new EngineError('invalid-request', `Precision must be a whole number of significant digits from ${MIN_PRECISION} to ${MAX_PRECISION}; got ${quote(value)}.`)
  }
  return value
}

const NO_POINTS: ResolvedPoints = { xs: [], grid: null, at: [], ascending: true, noun: 'Point', uniform: null }

/** Resolve, validate and fit: everything up to, not including, evaluation at the output points. */
export function fitRequest(request: FillRequest, withPoints = true): FittedRequest {
  if (typeof request !== 'object' || request === null) throw new EngineError('invalid-request', 'The request must be an object.')
  const def = methodDefinition(request.method)
  const options = resolveOptions(def, request.options)
  const transformId = pick<TransformId>(request.transform, Object.keys(TRANSFORMS) as TransformId[], 'none', 'transform')
  const extrapolation = pick(request.extrapolation, RULES, 'error', 'extrapolation rule')
  const kind = pick(request.kind, KINDS, 'other', 'kind')
  const compounding = resolveCompounding(request.compounding, kind)
  checkApplicability(def, kind, extrapolation)
  const precision = resolvePrecision(request.precision)
  const workingPrecision = precision + GUARD_DIGITS
  const D = decimalContext(workingPrecision)
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
  // without points (a refit for a check): the caller evaluates where it needs, and the kept grid resolution stays
  const points = withPoints ? resolvePoints(D, request.grid, request.at) : NO_POINTS
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
    notes.push(`${def.scale === 'log-discount' ? def.id : 'log-discount'}: the point t = 0, ln P(0) = 0 (P(0) = 1 by definition), was added to the knots.`)
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
    grid: points.grid,
    at: points.at,
    precision,
    workingPrecision,
    rounding: 'half-even',
    kind,
    ...(isCurveKind(kind) ? { compounding } : {}),
    money,
    knotCount: knots.x.length,
  }
  return { spec, D, def, transform, knots, pp, points, notes }
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
  if (transform.id === 'none') return raw
  const out: Dec[] = new Array<Dec>(xs.length)
  let atZero: Dec | null = null
  for (let k = 0; k < xs.length; k += 1) {
    const x = xs[k]!
    if (transform.id === 'log-discount' && x.isZero()) {
      atZero ??= logDiscountAtZero(fitted)
      out[k] = roundTo(atZero, P)
    }
    else {
      out[k] = roundTo(transform.inverse(x, raw[k]!), P)
    }
  }
  return out
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
export function fillCore(request: FillRequest): CoreFill {
  const fitted = fitRequest(request)
  const { xs, ascending, noun, uniform } = fitted.points
  // under log-discount the anchor at t = 0 is part of the curve, so [0, first knot) counts as inside
  assertInside(fitted.pp, xs, fitted.spec.extrapolation, noun, ascending, extrapolationAdvice(fitted.def))
  const values = evaluateValues(fitted, xs, ascending, uniform)
  const output: Knot[] = new Array<Knot>(xs.length)
  for (let k = 0; k < xs.length; k += 1) output[k] = { x: xs[k]!.toString(), y: values[k]!.toString() }
  return { ...fitted, values, output }
}
