import { factorBand, residualBand, solveBand, type BandLDL, type SymmetricBand } from './banded'
import { describeFailure, parseDecimal, quote, roundTo, type Dec, type DecimalCtor } from './decimal'
import { EngineError } from './errors'
import { graduationChecks } from './graduation-checks'
import { assertEqualSpacing } from './knots'
import { MARGIN_DIGITS, resolvePrecision, workingContext, workingPrecision } from './precision'
import type { GraduateRequest, GraduateResult, GraduationSpec } from './types'
import { ENGINE_VERSION } from './version'

const MAX_POINTS = 5000
const MAX_ORDER = 6
const MAX_REFINEMENTS = 6

export interface GraduationData {
  x: Dec[]
  y: Dec[]
  w: Dec[]
  /** Actual deaths and exposures when every point has both, else null. */
  deaths: Dec[] | null
  exposure: Dec[] | null
  weights: GraduationSpec['weights']
}

function parseField(D: DecimalCtor, point: Record<string, unknown>, name: string, position: number): Dec | null {
  const raw = point[name]
  if (raw === undefined || raw === null) return null
  const parsed = parseDecimal(D, raw)
  if (!parsed.ok) throw new EngineError('invalid-knot', `Point ${position}: ${name} ${quote(raw)} ${describeFailure(parsed.reason)}.`, position)
  return parsed.value
}

function parsePoints(D: DecimalCtor, raw: unknown): GraduationData {
  if (!Array.isArray(raw)) throw new EngineError('invalid-request', 'Points must be a list of {x, y, weight?, deaths?, exposure?}.')
  if (raw.length > MAX_POINTS) throw new EngineError('invalid-request', `At most ${MAX_POINTS} points can be graduated; ${raw.length} were given.`)
  const rows = raw.map((p: unknown, k) => {
    const position = k + 1
    if (typeof p !== 'object' || p === null) throw new EngineError('invalid-knot', `Point ${position} is not an {x, y} object.`, position)
    const point = p as Record<string, unknown>
    const x = parseField(D, point, 'x', position)
    if (!x) throw new EngineError('invalid-knot', `Point ${position} has no x.`, position)
    const deaths = parseField(D, point, 'deaths', position)
    const exposure = parseField(D, point, 'exposure', position)
    if (deaths && deaths.isNegative()) throw new EngineError('invalid-knot', `Point ${position} (x = ${x.toString()}): deaths cannot be negative.`, position)
    if (exposure && !exposure.gt(0)) throw new EngineError('invalid-knot', `Point ${position} (x = ${x.toString()}): exposure must be greater than 0.`, position)
    let y = parseField(D, point, 'y', position)
    if (!y) {
      if (!deaths || !exposure) throw new EngineError('invalid-knot', `Point ${position} (x = ${x.toString()}) needs y, or deaths and exposure (y = deaths / exposure).`, position)
      y = deaths.div(exposure)
    }
    const given = parseField(D, point, 'weight', position)
    if (given && given.isNegative()) throw new EngineError('invalid-knot', `Point ${position} (x = ${x.toString()}): the weight cannot be negative.`, position)
    // weights: as given; else the exposure (weights proportional to exposures, London 1985); else 1
    const w = given ?? exposure ?? new D(1)
    return { x, y, w, deaths, exposure, source: given ? 'given' : exposure ? 'exposure' : 'one', position }
  })
  rows.sort((a, b) => a.x.cmp(b.x))
  for (let i = 1; i < rows.length; i += 1) {
    if (rows[i]!.x.eq(rows[i - 1]!.x)) throw new EngineError('duplicate-x', `Points ${rows[i - 1]!.position} and ${rows[i]!.position} have the same x = ${rows[i]!.x.toString()}.`, rows[i]!.position)
  }
  const sources = new Set(rows.map(r => r.source))
  const full = rows.every(r => r.deaths && r.exposure)
  return {
    x: rows.map(r => r.x),
    y: rows.map(r => r.y),
    w: rows.map(r => r.w),
    deaths: full ? rows.map(r => r.deaths!) : null,
    exposure: full ? rows.map(r => r.exposure!) : null,
    weights: sources.size === 1 ? [...sources][0] as GraduationSpec['weights'] : 'mixed',
  }
}

/** c_k = (-1)^(z-k) C(z, k): the z-th forward difference Δ^z u_r = sum_k c_k u_{r+k}. */
function differenceCoefficients(z: number): number[] {
  const c: number[] = []
  let binom = 1
  for (let k = 0; k <= z; k += 1) {
    if (k > 0) binom = (binom * (z - k + 1)) / k
    c.push((z - k) % 2 === 0 ? binom : -binom)
  }
  return c
}

/** W + h K'K as a band of half-width z (K: the (n - z) x n matrix of z-th differences). Entries are exact decimals. */
function normalMatrix(D: DecimalCtor, w: Dec[], h: Dec, z: number): SymmetricBand {
  const n = w.length
  const lower = w.map(wi => [wi, ...Array.from({ length: z }, () => new D(0))])
  const c = differenceCoefficients(z)
  for (let r = 0; r + z < n; r += 1) {
    for (let a = 0; a <= z; a += 1) {
      for (let b = 0; b <= a; b += 1) lower[r + a]![a - b] = lower[r + a]![a - b]!.plus(h.times(c[a]! * c[b]!))
    }
  }
  return { n, m: z, lower }
}

/**
 * Whittaker-Henderson graduation: u minimising sum w (u - y)^2 + h sum (Δ^z u)^2 (Whittaker 1923; Henderson 1924; London,
 * Graduation: The Revision of Estimates, 1985, ch. 4), from the normal equations (W + h K'K) u = W y, a symmetric positive
 * definite band system solved by band LDL^T in O(n z^2), then refined: the residual exactly (scaled integers), the correction
 * from the same factors, until the correction is below 10^-(p + 2) of the largest value (iterative refinement; Higham,
 * Accuracy and Stability of Numerical Algorithms, 2nd ed., 2002, ch. 12). A large h makes the system ill-conditioned; the
 * refinement recovers the digits that the solve loses.
 */
export function graduate(request: GraduateRequest): GraduateResult {
  if (typeof request !== 'object' || request === null) throw new EngineError('invalid-request', 'The request must be an object.')
  const precision = resolvePrecision(request.precision)
  const D = workingContext(precision)
  const z = request.order ?? 3
  if (!Number.isInteger(z) || z < 1 || z > MAX_ORDER) throw new EngineError('invalid-option', `Order must be a whole number from 1 to ${MAX_ORDER}; got ${quote(z)}.`)
  const parsedH = parseDecimal(D, request.smoothing)
  if (!parsedH.ok) throw new EngineError('invalid-option', `Smoothing ${quote(request.smoothing)} ${describeFailure(parsedH.reason)}.`)
  const h = parsedH.value
  if (h.isNegative()) throw new EngineError('invalid-option', `Smoothing must be 0 or more; got ${h.toString()}.`)
  const exposureType = request.exposureType ?? 'central'
  if (exposureType !== 'central' && exposureType !== 'initial') throw new EngineError('invalid-option', `Exposure type ${quote(exposureType)}: choose central or initial.`)
  const data = parsePoints(D, request.points)
  const n = data.x.length
  if (n < z + 1) throw new EngineError('too-few-points', `Graduation of order ${z} needs at least ${z + 1} points; ${n} ${n === 1 ? 'was' : 'were'} given.`)
  assertEqualSpacing('Graduation', 'consecutive ages or terms at a fixed step', data.x, 'Differences are taken between neighbouring points, so the step must be the same throughout.')
  const A = normalMatrix(D, data.w, h, z)
  const F = factorBand(A)
  if (!F) {
    const positive = data.w.filter(w => w.gt(0)).length
    if (h.isZero() ? positive < n : positive < z) throw new EngineError('too-few-points', `The graduation has no unique answer: with smoothing above 0 it needs at least ${z} points of positive weight, and with smoothing 0 every weight must be positive.`)
    throw new EngineError('ill-conditioned', `The smoothing is too large for ${precision} digits: the system lost every digit in the solve. Raise the precision or lower the smoothing.`)
  }
  const b = data.y.map((y, i) => data.w[i]!.times(y))
  const { u, refinements } = refinedSolve(A, F, b, precision)
  const values = u.map(v => roundTo(v, precision))
  const spec: GraduationSpec = {
    engineVersion: ENGINE_VERSION,
    method: 'whittaker-henderson',
    order: z,
    smoothing: h.toString(),
    precision,
    workingPrecision: workingPrecision(precision),
    rounding: 'half-even',
    exposureType,
    weights: data.weights,
    pointCount: n,
    refinements,
  }
  return {
    points: values.map((v, i) => ({ x: data.x[i]!.toString(), y: v.toString() })),
    spec,
    diagnostics: graduationChecks({ data, values, F, order: z, precision, exposureType }),
  }
}

function refinedSolve(A: SymmetricBand, F: BandLDL, b: Dec[], precision: number): { u: Dec[], refinements: number } {
  const D = b[0]!.constructor as DecimalCtor
  let u = solveBand(F, b)
  for (let k = 1; k <= MAX_REFINEMENTS; k += 1) {
    const delta = solveBand(F, residualBand(A, u, b, D))
    u = u.map((ui, i) => ui.plus(delta[i]!))
    const largest = u.reduce((m, v) => (v.abs().gt(m) ? v.abs() : m), new D(0))
    const step = delta.reduce((m, v) => (v.abs().gt(m) ? v.abs() : m), new D(0))
    if (step.lte(largest.times(new D(10).pow(-(precision + MARGIN_DIGITS + 1))))) return { u, refinements: k }
  }
  throw new EngineError('ill-conditioned', `The smoothing is too large for ${precision} digits: the solution did not settle after ${MAX_REFINEMENTS} refinements. Raise the precision or lower the smoothing.`)
}
