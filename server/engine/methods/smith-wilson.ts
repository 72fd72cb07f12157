import { roundTo, type Dec, type DecimalCtor } from '../decimal'
import { EngineError } from '../errors'
import type { ClosedForm } from '../piecewise'
import { GUARD_DIGITS, denseSolvePrecision, searchPrecision } from '../precision'
import { fitWilson, forwardIntensity, inContext, wilsonG, wilsonLnP, type WilsonFit } from '../smith-wilson'
import { CURVE_KINDS, type ConvergenceReport } from '../types'
import type { MethodDefinition } from './method'

/** EIOPA's lower bound for alpha and its convergence criterion: the forward intensity within 1 bp of ln(1 + UFR). */
const ALPHA_FLOOR = '0.05'
const TOLERANCE = '0.0001'
/** The alpha search runs on multiples of this step (the search tolerance): alpha is found to 6 decimals. */
export const ALPHA_STEP = '0.000001'
const ALPHA_CEILING = 100

interface Setting { u: Dec[], lnP: Dec[], omega: Dec, cp: Dec, digits: number }

/** The given terms the fit uses: 0 < u <= LLP (t = 0 carries no information: P(0) = 1). */
function usedTerms(x: Dec[], y: Dec[], llp: Dec): { u: Dec[], lnP: Dec[] } {
  const u: Dec[] = []
  const lnP: Dec[] = []
  x.forEach((t, i) => {
    if (t.gt(0) && t.lte(llp)) {
      u.push(t)
      lnP.push(y[i]!)
    }
  })
  return { u, lnP }
}

/** The fit at alpha and its forward intensity at the convergence point; gap = |forward - omega|. */
function gapAt(s: Setting, alpha: Dec): { fit: WilsonFit, forward: Dec, gap: Dec } {
  const fit = fitWilson(s.u, s.lnP, s.omega, alpha, s.digits)
  const forward = forwardIntensity(fit, s.cp)
  return { fit, forward, gap: forward.minus(fit.omega).abs() }
}

/**
 * The smallest alpha >= 0.05 on the grid of multiples of ALPHA_STEP at which the gap at the convergence point is at most
 * 1 bp: alpha = 0.05 if it meets the criterion, else doubling from 0.1 until one does, then bisection on the grid between
 * the last alpha that failed and the first that met it (EIOPA technical documentation: alpha >= 0.05, convergence within
 * 1 bp at the convergence point). Bisection assumes the gap falls as alpha grows between the two, which it does on curves
 * seen in practice; the report shows the check one grid step below the result. The search runs at searchPrecision() (precision.ts) and its
 * answer is confirmed at the full precision (met at alpha, not met one step lower); if it is not, the search runs again at
 * the full precision.
 */
function calibrateAlpha(s: Setting, D: DecimalCtor): Dec {
  const step = new D(ALPHA_STEP)
  const tol = new D(TOLERANCE)
  const floor = new D(ALPHA_FLOOR).div(step).toNumber()
  const meets = (k: number, digits: number) => gapAt({ ...s, digits }, step.times(k)).gap.lte(tol)
  const search = (digits: number): number => {
    let lo = floor
    if (meets(lo, digits)) return lo
    let hi = lo * 2
    while (!meets(hi, digits)) {
      lo = hi
      hi *= 2
      if (step.times(hi).gt(ALPHA_CEILING)) {
        throw new EngineError('calibration-failed', `No alpha up to ${ALPHA_CEILING} brings the forward intensity at the convergence point within 1 basis point of ln(1 + UFR); give alpha or a later convergence point.`)
      }
    }
    while (hi - lo > 1) {
      const mid = Math.floor((lo + hi) / 2)
      if (meets(mid, digits)) hi = mid
      else lo = mid
    }
    return hi
  }
  let k = search(Math.min(searchPrecision(), s.digits))
  const confirmed = meets(k, s.digits) && (k === floor || !meets(k - 1, s.digits))
  if (!confirmed) k = search(s.digits)
  return step.times(k)
}

function option(D: DecimalCtor, value: string | undefined, name: string, fallback: () => Dec): Dec {
  if (value === undefined || value === 'auto' || value === 'last-knot') return fallback()
  const v = new D(value)
  if (!v.isFinite()) throw new EngineError('invalid-option', `Option ${name} of smith-wilson must be a number.`)
  return v
}

function settingOf(x: Dec[], y: Dec[], options: Record<string, string>, D: DecimalCtor): Setting & { llp: Dec } {
  const given = x.filter(t => t.gt(0))
  if (given.length === 0) throw new EngineError('too-few-points', 'Method smith-wilson needs at least one point with a term above 0.')
  const llp = option(D, options.llp, 'llp', () => given[given.length - 1]!)
  if (llp.lt(given[0]!)) throw new EngineError('invalid-option', `Option llp of smith-wilson (${llp.toString()}) lies before the first given term (${given[0]!.toString()}).`)
  // default convergence point max(LLP + 40, 60) (EIOPA technical documentation)
  const cp = option(D, options.convergencePoint, 'convergencePoint', () => (llp.plus(40).gt(60) ? llp.plus(40) : new D(60)))
  if (!cp.gt(llp)) throw new EngineError('invalid-option', `Option convergencePoint of smith-wilson (${cp.toString()}) must lie beyond the last liquid point ${llp.toString()}.`)
  const ufr = new D(options.ufr ?? '0.035')
  if (!ufr.gt(-1)) throw new EngineError('invalid-option', 'Option ufr of smith-wilson must be above -1 (an annual rate).')
  return { ...usedTerms(x, y, llp), omega: ufr.plus(1).ln(), cp, llp, digits: denseSolvePrecision(D.precision) }
}

/** The convergence check at alpha, and one step of the search grid lower (figures at the stated precision). */
function report(s: Setting, alpha: Dec, at: { forward: Dec, gap: Dec }, D: DecimalCtor): ConvergenceReport {
  const tol = new D(TOLERANCE)
  const lower = alpha.minus(ALPHA_STEP)
  const below = lower.gte(ALPHA_FLOOR) ? gapAt(s, lower).gap : null
  const text = (v: Dec) => roundTo(v, D.precision - GUARD_DIGITS).toString()
  return {
    convergencePoint: s.cp.toString(),
    alpha: alpha.toString(),
    ultimateIntensity: text(s.omega),
    forwardIntensity: text(at.forward),
    gap: text(at.gap),
    tolerance: TOLERANCE,
    met: at.gap.lte(tol),
    below: below ? { alpha: lower.toString(), gap: text(below), met: below.lte(tol) } : null,
  }
}

export const smithWilson: MethodDefinition = {
  id: 'smith-wilson',
  label: 'Smith-Wilson (to an ultimate forward rate)',
  minPoints: 1,
  source: 'Smith and Wilson (2001), "Fitting yield curves with long term constraints"; zero-coupon formulation as in EIOPA, "Technical documentation of the methodology to derive EIOPA\'s risk-free interest rate term structures" (Smith-Wilson chapter).',
  summary: 'For spot rates and discount factors. Passes through every given point up to the last liquid point and carries the curve beyond it to the ultimate forward rate; alpha sets how fast. Not local: one point moves the whole curve. Beyond the last knot it needs extrapolation \'method\'.',
  options: [
    { name: 'ufr', label: 'Ultimate forward rate', type: 'decimal', default: '0.035', description: 'Ultimate forward rate, an annual rate (0.035 = 3.5 %). Use the value your regulator publishes for the currency and date.' },
    { name: 'alpha', label: 'Convergence speed (alpha)', type: 'decimal', keywords: ['auto'], valueLabels: { auto: 'Calibrated (the smallest that converges)' }, default: 'auto', description: 'Convergence speed. auto: the smallest alpha of at least 0.05 (to 6 decimals) for which the forward intensity at the convergence point is within 1 basis point of ln(1 + UFR).' },
    { name: 'llp', label: 'Last liquid point', type: 'decimal', keywords: ['last-knot'], valueLabels: { 'last-knot': 'The last given term' }, default: 'last-knot', description: 'Last liquid point: given terms beyond it are not used. Default: the last given term.' },
    { name: 'convergencePoint', label: 'Convergence point', type: 'decimal', keywords: ['auto'], valueLabels: { auto: 'Last liquid point + 40, at least 60' }, default: 'auto', description: 'Term at which the forward must be within 1 bp of the UFR. auto: max(LLP + 40, 60).' },
  ],
  scale: 'log-discount',
  appliesTo: { kinds: [...CURVE_KINDS], spacing: 'any' },
  extension: 'required',
  calibrate(x, y, options, D) {
    const s = settingOf(x, y, options, D)
    const alpha = options.alpha === 'auto' ? calibrateAlpha(s, D) : option(D, options.alpha, 'alpha', () => new D(0))
    if (!alpha.gt(0)) throw new EngineError('invalid-option', 'Option alpha of smith-wilson must be above 0 (or auto).')
    return { ufr: new D(options.ufr ?? '0.035').toString(), alpha: alpha.toString(), llp: s.llp.toString(), convergencePoint: s.cp.toString() }
  },
  fit(x, y, options, D) {
    const s = settingOf(x, y, options, D)
    const alpha = new D(options.alpha!)
    const check = gapAt(s, alpha)
    const at = inContext(check.fit, D)
    const left = x.filter(t => t.gt(s.llp))
    const closedForm: ClosedForm = {
      evaluate: (xs, digits) => xs.map((t) => {
        if (t.isNegative()) throw new EngineError('outside-knots', `Term ${t.toString()} lies before t = 0, where the curve starts.`)
        return wilsonLnP(at, t, digits)
      }),
      derivative: (t, order) => {
        const { G, G1, G2 } = wilsonG(at, t)
        const r = G1.div(G)
        // (ln P)' = -omega + G'/G, (ln P)'' = G''/G - (G'/G)^2
        return order === 1 ? r.minus(at.omega) : G2.div(G).minus(r.times(r))
      },
      notes: left.length ? [`smith-wilson: ${left.length} given term(s) beyond the last liquid point ${s.llp.toString()} (${left.map(t => t.toString()).join(', ')}) were not used.`] : [],
      convergence: () => report(s, alpha, check, D),
    }
    // x[0] is t = 0 (the pipeline anchors curve methods there)
    return { breaks: [x[0]!, ...s.u], coefs: [], endValue: s.lnP[s.lnP.length - 1]!, closedForm }
  },
}
