import { describeFailure, exp, parseDecimal, quote, roundTo, type Dec, type DecimalCtor } from './decimal'
import { EngineError } from './errors'
import { CLOSURE_RULES, type ClosureReport, type ClosureRule, type ExtrapolationRule } from './types'

/** Extrapolation rules that close a q_x table at old ages with a fitted law. */
export const isClosure = (rule: ExtrapolationRule): rule is ClosureRule => (CLOSURE_RULES as readonly string[]).includes(rule)

const FIT_SPAN = 15
const MAX_ITERATIONS = 200

export interface ClosureLaw {
  rule: ClosureRule
  /** The last knot: the law applies above it. */
  from: Dec
  terminalAge: Dec
  /** q at x (x above the last knot): 1 - exp(-h(x)) below the terminal age, 1 from it on. */
  q(x: Dec): Dec
  report: ClosureReport
}

/**
 * Options of a closure rule, validated, with defaults: terminalAge 120 (q = 1 there and above), fitFrom the last knot - 15,
 * fitTo the last knot. Recorded as decimal strings in the resolved spec.
 */
export function resolveClosureOptions(D: DecimalCtor, raw: unknown, lastKnot: Dec): Record<string, string> {
  if (raw !== undefined && raw !== null && (typeof raw !== 'object' || Array.isArray(raw))) throw new EngineError('invalid-option', 'extrapolationOptions must be an object of named values.')
  const given = (raw ?? {}) as Record<string, unknown>
  for (const name of Object.keys(given)) {
    if (!['terminalAge', 'fitFrom', 'fitTo'].includes(name)) throw new EngineError('invalid-option', `Closure has no option '${name}'; it takes terminalAge, fitFrom, fitTo.`)
  }
  const read = (name: string, fallback: Dec): Dec => {
    if (given[name] === undefined || given[name] === null) return fallback
    const parsed = parseDecimal(D, given[name])
    if (!parsed.ok) throw new EngineError('invalid-option', `Closure option ${name} ${quote(given[name])} ${describeFailure(parsed.reason)}.`)
    return parsed.value
  }
  const terminalAge = read('terminalAge', new D(120))
  const fitTo = read('fitTo', lastKnot)
  const fitFrom = read('fitFrom', fitTo.minus(FIT_SPAN))
  if (!terminalAge.gt(lastKnot)) throw new EngineError('invalid-option', `The terminal age (${terminalAge.toString()}) must lie above the last given age (${lastKnot.toString()}).`)
  if (!fitTo.gt(fitFrom)) throw new EngineError('invalid-option', `The fitting range must run upward: fitFrom ${fitFrom.toString()}, fitTo ${fitTo.toString()}.`)
  return { terminalAge: terminalAge.toString(), fitFrom: fitFrom.toString(), fitTo: fitTo.toString() }
}

/** h_x = -ln(1 - q_x): the force of mortality integrated over [x, x+1] (p_x = exp(-integral of mu); Dickson, Hardy and Waters, AMLCR). */
function hazard(q: Dec): Dec {
  return q.neg().plus(1).ln().neg()
}

/**
 * Fit the closure law to the given knots (ages x, q_x) in the fitting range, on the hazard scale: ln h_x, so that each age
 * counts by its relative error. Data that follow the law exactly give zero residuals, and the law continues them exactly.
 */
export function fitClosure(rule: ClosureRule, x: Dec[], q: Dec[], options: Record<string, string>, D: DecimalCtor): ClosureLaw {
  const from = new D(options.fitFrom!)
  const to = new D(options.fitTo!)
  const ages: Dec[] = []
  const logH: Dec[] = []
  x.forEach((xi, i) => {
    if (xi.lt(from) || xi.gt(to)) return
    const qi = q[i]!
    if (!qi.gt(0) || !qi.lt(1)) throw new EngineError('transform-domain', `Closure by ${rule}: q at age ${xi.toString()} is ${qi.toString()}; the fitting ages need 0 < q < 1.`)
    ages.push(xi)
    logH.push(hazard(qi).ln())
  })
  if (ages.length < 2) {
    throw new EngineError('too-few-points', `Closure by ${rule} is fitted to the given ages from ${from.toString()} to ${to.toString()}; ${ages.length} ${ages.length === 1 ? 'lies' : 'lie'} there and at least 2 are needed. Widen fitFrom / fitTo.`)
  }
  const line = leastSquaresLine(ages, logH, D)
  if (!line.slope.gt(0)) throw new EngineError('transform-domain', `Closure by ${rule}: q does not rise over the fitting ages ${from.toString()} to ${to.toString()}; a mortality law for old ages needs rising mortality.`)
  const fit = rule === 'gompertz' ? gompertz(line) : kannisto(ages, logH, line, from, D)
  const residual = ages.reduce((m, a, i) => { const r = fit.logH(a).minus(logH[i]!).abs(); return r.gt(m) ? r : m }, new D(0))
  const lastKnot = x[x.length - 1]!
  const terminalAge = new D(options.terminalAge!)
  const q1 = (age: Dec) => (age.gte(terminalAge) ? new D(1) : exp(fit.hazard(age).neg()).neg().plus(1))
  const jump = q1(lastKnot).minus(q[q.length - 1]!)
  return {
    rule,
    from: lastKnot,
    terminalAge,
    q: q1,
    report: {
      law: rule,
      parameters: Object.fromEntries(Object.entries(fit.parameters).map(([k, v]) => [k, roundTo(v, 12).toString()])),
      fitFrom: from.toString(),
      fitTo: to.toString(),
      fitAges: ages.length,
      maxLogHazardResidual: roundTo(residual, 6).toString(),
      lawMinusGivenAtLastAge: roundTo(jump, 12).toString(),
      terminalAge: terminalAge.toString(),
    },
  }
}

/** Ordinary least squares y = a + b x (Gauss; closed form, exact up to one rounding per operation). */
function leastSquaresLine(x: Dec[], y: Dec[], D: DecimalCtor): { intercept: Dec, slope: Dec } {
  const n = new D(x.length)
  const mx = x.reduce((s, v) => s.plus(v), new D(0)).div(n)
  const my = y.reduce((s, v) => s.plus(v), new D(0)).div(n)
  let sxy = new D(0)
  let sxx = new D(0)
  x.forEach((xi, i) => {
    const dx = xi.minus(mx)
    sxy = sxy.plus(dx.times(y[i]!.minus(my)))
    sxx = sxx.plus(dx.times(dx))
  })
  const slope = sxy.div(sxx)
  return { intercept: my.minus(slope.times(mx)), slope }
}

interface FittedLaw {
  /** h_x, the law's hazard over [x, x+1]. */
  hazard(x: Dec): Dec
  logH(x: Dec): Dec
  parameters: Record<string, Dec>
}

/**
 * Gompertz (1825): mu_x = B c^x, so h_x = B c^x (c - 1) / ln c and ln h_x = alpha + beta x is a straight line: the least-squares
 * line through ln h is exact for Gompertz data. c = e^beta, B = e^alpha beta / (c - 1).
 */
function gompertz(line: { intercept: Dec, slope: Dec }): FittedLaw {
  const c = exp(line.slope)
  const B = exp(line.intercept).times(line.slope).div(c.minus(1))
  const logH = (age: Dec) => line.intercept.plus(line.slope.times(age))
  return { hazard: age => exp(logH(age)), logH, parameters: { B, c } }
}

/** ln h and its first and second derivatives in (ln a, b) at one age, for the Kannisto fit. */
interface Terms { logH: Dec, d: [Dec, Dec], dd: [Dec, Dec, Dec] }

/**
 * Kannisto (Thatcher, Kannisto and Vaupel 1998; the Human Mortality Database methods protocol, Wilmoth et al., v6 2021,
 * old-age mortality): mu_x = a e^(b (x - x0)) / (1 + a e^(b (x - x0))), logistic in mu, x0 the start of the fitting range.
 * With g(t) = ln(1 + a e^(b t)), the year's hazard is h_x = (g(x + 1 - x0) - g(x - x0)) / b (the integral of mu over the
 * year). Fitted to ln h by least squares: a start in binary floating point (Gauss-Newton from the Gompertz line), then
 * Newton's method in decimal with the exact Hessian (quadratic convergence) and step halving.
 */
function kannisto(ages: Dec[], logH: Dec[], line: { intercept: Dec, slope: Dec }, x0: Dec, D: DecimalCtor): FittedLaw {
  const ts = ages.map(a => a.minus(x0))
  let [lnA, b] = floatStart(ts.map(t => t.toNumber()), logH.map(v => v.toNumber()), line.slope.toNumber(), line.intercept.plus(line.slope.times(x0)).toNumber()).map(v => new D(v))
  const objective = (p: Dec, q: Dec) => ts.reduce((acc, t, i) => acc.plus(kannistoTerms(p, q, t, false).logH.minus(logH[i]!).pow(2)), new D(0))
  let current: Dec | null = null
  const NEAR = new D('1e-8')
  const tolerance = new D(10).pow(-(D.precision - 4))
  for (let iteration = 0; iteration < MAX_ITERATIONS; iteration += 1) {
    // gradient and Hessian of S = sum r^2, r = ln h - ln h_given: S' = 2 sum r r', S'' = 2 sum (r' r'^T + r r'')
    let g1 = new D(0); let g2 = new D(0); let h11 = new D(0); let h12 = new D(0); let h22 = new D(0)
    ts.forEach((t, i) => {
      const k = kannistoTerms(lnA!, b!, t, true)
      const r = k.logH.minus(logH[i]!)
      g1 = g1.plus(r.times(k.d[0])); g2 = g2.plus(r.times(k.d[1]))
      h11 = h11.plus(k.d[0].times(k.d[0])).plus(r.times(k.dd[0]))
      h12 = h12.plus(k.d[0].times(k.d[1])).plus(r.times(k.dd[1]))
      h22 = h22.plus(k.d[1].times(k.d[1])).plus(r.times(k.dd[2]))
    })
    const det = h11.times(h22).minus(h12.times(h12))
    if (!det.gt(0) || !h11.gt(0)) break // not a minimum's neighbourhood: the start was too far
    let stepA = h22.times(g1).minus(h12.times(g2)).div(det).neg()
    let stepB = h11.times(g2).minus(h12.times(g1)).div(det).neg()
    // near the minimum (steps below 1e-8) Newton converges quadratically: take the step; farther out, halve it while it
    // leaves b > 0 or raises the sum of squares (beyond rounding)
    const near = stepA.abs().lt(NEAR.times(lnA!.abs().plus(1))) && stepB.abs().lt(NEAR.times(b!.abs().plus(1)))
    if (!near) {
      current ??= objective(lnA!, b!)
      const trial = () => (b!.plus(stepB).gt(0) ? objective(lnA!.plus(stepA), b!.plus(stepB)) : null)
      let next = trial()
      for (let halvings = 0; (next === null || next.gt(current.times(tolerance.plus(1)))) && halvings < 60; halvings += 1) {
        stepA = stepA.div(2)
        stepB = stepB.div(2)
        next = trial()
      }
      if (next === null) break
      current = next
    }
    else current = null
    lnA = lnA!.plus(stepA)
    b = b!.plus(stepB)
    if (stepA.abs().lte(tolerance.times(lnA.abs().plus(1))) && stepB.abs().lte(tolerance.times(b.abs().plus(1)))) {
      return kannistoLaw(lnA, b, x0)
    }
  }
  throw new EngineError('ill-conditioned', `Closure by kannisto: the fit over ages ${ages[0]!.toString()} to ${ages[ages.length - 1]!.toString()} did not settle; try gompertz or a wider fitting range.`)
}

/** The fitted Kannisto law: h from g(t) = ln(1 + a e^(b t)), each g kept for the next whole age (h_x and h_x+1 share one). */
function kannistoLaw(lnA: Dec, b: Dec, x0: Dec): FittedLaw {
  const gs = new Map<string, Dec>()
  const g = (t: Dec) => {
    const key = t.toString()
    let v = gs.get(key)
    if (!v) {
      v = exp(lnA.plus(b.times(t))).plus(1).ln()
      if (gs.size < 10_000) gs.set(key, v)
    }
    return v
  }
  const hazard = (age: Dec) => { const t = age.minus(x0); return g(t.plus(1)).minus(g(t)).div(b) }
  return { hazard, logH: age => hazard(age).ln(), parameters: { a: exp(lnA), b, x0 } }
}

/**
 * ln h at t = x - x0 and its derivatives in (ln a, b). With e = e^(ln a + b t), g = ln(1 + e), s = e / (1 + e) (= mu) and
 * v = s (1 - s): dg/d ln a = s, dg/db = t s, and the second derivatives v, t v, t^2 v; G = g(t + 1) - g(t), h = G / b.
 */
function kannistoTerms(lnA: Dec, b: Dec, t: Dec, derivatives: boolean): Terms {
  const at = (u: Dec) => {
    const e = exp(lnA.plus(b.times(u)))
    const s = e.div(e.plus(1))
    return { u, g: e.plus(1).ln(), s, v: s.times(s.neg().plus(1)) }
  }
  const p = at(t)
  const q = at(t.plus(1))
  const G = q.g.minus(p.g)
  const h = G.div(b)
  const logH = h.ln()
  const zero = b.times(0)
  if (!derivatives) return { logH, d: [zero, zero], dd: [zero, zero, zero] }
  const S1 = q.s.minus(p.s)
  const T1 = q.u.times(q.s).minus(p.u.times(p.s))
  const Gaa = q.v.minus(p.v)
  const Gab = q.u.times(q.v).minus(p.u.times(p.v))
  const Gbb = q.u.pow(2).times(q.v).minus(p.u.pow(2).times(p.v))
  const b2 = b.times(b)
  // derivatives of h = G / b, then of ln h: (ln h)' = h'/h, (ln h)'' = h''/h - h'h'^T/h^2
  const ha = S1.div(b)
  const hb = T1.div(b).minus(G.div(b2))
  const haa = Gaa.div(b)
  const hab = Gab.div(b).minus(S1.div(b2))
  const hbb = Gbb.div(b).minus(T1.times(2).div(b2)).plus(G.times(2).div(b2.times(b)))
  const la = ha.div(h)
  const lb = hb.div(h)
  return { logH, d: [la, lb], dd: [haa.div(h).minus(la.times(la)), hab.div(h).minus(la.times(lb)), hbb.div(h).minus(lb.times(lb))] }
}

/** A start for the decimal Newton steps: Gauss-Newton in binary floating point from the Gompertz line (ln h ~ ln a + b t + ln((e^b - 1)/b)). */
function floatStart(ts: number[], logH: number[], slope: number, interceptAtX0: number): [number, number] {
  let b = slope
  let lnA = interceptAtX0 - Math.log(Math.expm1(b) / b)
  const model = (p: number, q: number, t: number) => {
    const g = (u: number) => Math.log1p(Math.exp(p + q * u))
    return Math.log((g(t + 1) - g(t)) / q)
  }
  for (let iteration = 0; iteration < 100; iteration += 1) {
    let a11 = 0, a12 = 0, a22 = 0, r1 = 0, r2 = 0
    const eps = 1e-7
    ts.forEach((t, i) => {
      const r = model(lnA, b, t) - logH[i]!
      const dA = (model(lnA + eps, b, t) - model(lnA - eps, b, t)) / (2 * eps)
      const dB = (model(lnA, b + eps, t) - model(lnA, b - eps, t)) / (2 * eps)
      a11 += dA * dA; a12 += dA * dB; a22 += dB * dB; r1 += dA * r; r2 += dB * r
    })
    const det = a11 * a22 - a12 * a12
    if (!(det > 0)) break
    const sA = -(a22 * r1 - a12 * r2) / det
    const sB = -(a11 * r2 - a12 * r1) / det
    if (!(b + sB > 0) || !Number.isFinite(sA + sB)) break
    lnA += sA
    b += sB
    if (Math.abs(sA) < 1e-13 * (1 + Math.abs(lnA)) && Math.abs(sB) < 1e-13 * (1 + Math.abs(b))) break
  }
  return [lnA, b]
}
