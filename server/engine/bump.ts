import { roundTo, type Dec } from './decimal'
import { EngineError } from './errors'
import { evaluateValues, fitRequest, type CoreFill } from './pipeline'
import type { BumpReport, FillRequest } from './types'

const CURVES = new Set(['spot-rate', 'discount-factor'])

/**
 * Locality of a bump (Hagan and West 2006, "Interpolation Methods for Curve Construction", section 2: moving one input
 * should move the curve only nearby): the middle given point is raised by 1 basis point (curves) or 1 % of its value (other
 * tables), the method is fitted again, and both fits are compared at the middle of every interval between given points.
 * Reported: the span where anything changed at the stated precision, the span where the change is at least 1 % of the
 * bump, and the largest change as a multiple of the bump (above 1: the method overshoots the bump).
 */
export function bumpReach(core: CoreFill): BumpReport | null {
  const { knots, spec, D } = core
  const n = knots.x.length
  if (n < 3) return null
  const j = Math.floor(n / 2)
  const yj = knots.y[j]!
  const size = CURVES.has(spec.kind) || yj.isZero() ? new D('0.0001') : yj.abs().times('0.01')
  const request: FillRequest = {
    knots: knots.x.map((x, i) => ({ x: x.toString(), y: (i === j ? knots.y[i]!.plus(size) : knots.y[i]!).toString() })),
    method: spec.method,
    options: spec.options,
    transform: spec.transform,
    // the probes lie inside the knots: the rule only has to be one the method accepts
    extrapolation: spec.extrapolation,
    kind: spec.kind,
    ...(spec.compounding ? { compounding: spec.compounding } : {}),
    precision: spec.precision,
    at: ['0'],
  }
  let bumped
  try {
    bumped = fitRequest(request, null)
  }
  catch (error) {
    if (error instanceof EngineError) return null // the bumped value leaves the transform's domain (say q = 1 under logit)
    throw error
  }
  const probes: Dec[] = []
  for (let i = 0; i + 1 < n; i += 1) probes.push(knots.x[i]!.plus(knots.x[i + 1]!).div(2))
  const before = evaluateValues(core, probes, true)
  const after = evaluateValues(bumped, probes, true)
  const changes = probes.map((_, i) => after[i]!.minus(before[i]!).abs())
  const threshold = size.div(100)
  const span = (keep: (d: Dec) => boolean) => {
    const hit = changes.map((d, i) => (keep(d) ? i : -1)).filter(i => i >= 0)
    if (!hit.length) return null
    return { from: knots.x[hit[0]!]!.toString(), to: knots.x[hit[hit.length - 1]! + 1]!.toString(), intervals: hit.length }
  }
  let largest = changes[0]!
  let largestAt = 0
  changes.forEach((d, i) => { if (d.gt(largest)) { largest = d; largestAt = i } })
  return {
    basis: `y at x = ${knots.x[j]!.toString()} raised by ${size.toString()}; both fits compared at the middle of each of the ${n - 1} intervals between given points`,
    at: knots.x[j]!.toString(),
    size: size.toString(),
    intervals: n - 1,
    changed: span(d => !d.isZero()),
    material: span(d => d.gte(threshold)),
    largest: largest.toString(),
    largestAt: probes[largestAt]!.toString(),
    ratio: roundTo(largest.div(size), 6).toString(),
  }
}
