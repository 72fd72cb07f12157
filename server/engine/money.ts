import { intensityOf, rateInDomain, rateOfIntensityExact } from './compounding'
import { roundTo, type Dec } from './decimal'
import { evaluateValues, type CoreFill } from './pipeline'
import type { MoneyFigure, MoneyImpact } from './types'
import { lapseSummary, salarySummary } from './summaries'

const RADIX = 100000

/** How much the fill moves the money (docs/domain.md#checks): life expectancy and annuities for q_x, PVs and durations for curves;
 * for lapse and salary tables a money-free summary (policies in force, salary growth). */
export function computeMoney(core: CoreFill): MoneyImpact {
  const kind = core.spec.kind
  if (kind === 'mortality') return mortalityMoney(core)
  if (kind === 'spot-rate' || kind === 'discount-factor') return curveMoney(core)
  if (kind === 'lapse') return lapseSummary(core)
  if (kind === 'salary') return salarySummary(core)
  return { basis: 'none', available: false, reason: 'A table of kind "other" has no summary: its values carry no fixed meaning.', figures: [] }
}

function unavailable(basis: MoneyImpact['basis'], reason: string): MoneyImpact {
  return { basis, available: false, reason, figures: [] }
}

/**
 * l_x from a radix of 100,000 at the first integer age of the fill, l_{x+1} = l_x (1 - q_x); curtate e_x = sum_{k>=1} l_{x+k}/l_x;
 * annuity-due = sum_{k>=0} v^k l_{x+k}/l_x, v = 1/(1+i) (Dickson, Hardy and Waters, AMLCR: life tables and annuities).
 * Sums stop at the last integer age of the fill (the table is treated as closed there).
 */
function mortalityMoney(core: CoreFill): MoneyImpact {
  const { xs } = core.points
  const byAge = new Map<number, Dec>()
  xs.forEach((x, k) => {
    if (x.isInteger() && x.abs().lte(1000)) byAge.set(x.toNumber(), core.values[k]!)
  })
  if (byAge.size < 2) return unavailable('mortality', 'The fill needs an integer-age grid (step 1 or a divisor of 1) to build l_x.')
  const ages = [...byAge.keys()].sort((a, b) => a - b)
  const first = ages[0]!
  const last = ages[ages.length - 1]!
  for (let a = first; a <= last; a += 1) {
    if (!byAge.has(a)) return unavailable('mortality', `The fill has no value at age ${a}; l_x needs every integer age from ${first} to ${last}.`)
  }
  for (const a of ages) {
    const q = byAge.get(a)!
    if (q.lt(0) || q.gt(1)) return unavailable('mortality', `q at age ${a} is ${q.toString()}, outside [0, 1]; l_x cannot be built.`)
  }
  const D = core.D
  const P = core.spec.precision
  const l: Dec[] = [new D(RADIX)]
  for (let a = first; a < last; a += 1) l.push(l[l.length - 1]!.times(new D(1).minus(byAge.get(a)!)))
  const v = new D(1).div(new D(core.spec.money.interest).plus(1))
  const figures: MoneyFigure[] = []
  for (const age of core.spec.money.ages) {
    const labelE = `Curtate life expectancy e_${age}`
    const labelA = `Annuity-due a_${age} at ${core.spec.money.interest}`
    if (age < first || age > last) {
      const reason = `Age ${age} is outside the filled integer ages ${first}..${last}.`
      figures.push({ key: `e(${age})`, label: labelE, value: null, reason }, { key: `adue(${age})`, label: labelA, value: null, reason })
      continue
    }
    const j = age - first
    const lx = l[j]!
    if (lx.isZero()) {
      const reason = `No survivors at age ${age} (l_x = 0).`
      figures.push({ key: `e(${age})`, label: labelE, value: null, reason }, { key: `adue(${age})`, label: labelA, value: null, reason })
      continue
    }
    let e = new D(0)
    let a = new D(0)
    let vk = new D(1)
    for (let k = j; k < l.length; k += 1) {
      if (k > j) e = e.plus(l[k]!)
      a = a.plus(vk.times(l[k]!))
      vk = vk.times(v)
    }
    figures.push({ key: `l(${age})`, label: `l_${age} (radix ${RADIX} at age ${first})`, value: roundTo(lx, P).toString() })
    figures.push({ key: `e(${age})`, label: labelE, value: roundTo(e.div(lx), P).toString() })
    figures.push({ key: `adue(${age})`, label: labelA, value: roundTo(a.div(lx), P).toString() })
  }
  return { basis: 'mortality', available: figures.some(f => f.value !== null), figures }
}

/**
 * Discount factors P(t) = (1 + r(t))^-t for spot rates (annual compounding; exp(-t intensity(r)) under another) or the filled
 * P(t); forward rates between key terms f = (P(t1)/P(t2))^(1/(t2 - t1)) - 1 (annual; the same intensity quoted under another
 * compounding); level annuity PV = sum_{k=1}^N P(k); Macaulay duration = sum k P(k) / sum P(k)
 * (Hull, Options, Futures and Other Derivatives, ch. 4; Macaulay 1938).
 */
function curveMoney(core: CoreFill): MoneyImpact {
  const D = core.D
  const P = core.spec.precision
  const c = core.spec.compounding ?? 'annual'
  const fromSpot = (t: Dec, r: Dec) => (c === 'annual' ? r.plus(1).pow(t.neg()) : intensityOf(r, c).times(t).neg().exp())
  const forward = (p1: Dec, p2: Dec, dt: Dec) => (c === 'annual'
    ? p1.div(p2).pow(new D(1).div(dt)).minus(1)
    : rateOfIntensityExact(p1.div(p2).ln().div(dt), c))
  const rule = core.spec.extrapolation
  const lo = core.pp.breaks[0]!
  const hi = core.pp.breaks[core.pp.breaks.length - 1]!
  const outside = (t: Dec) => rule === 'error' && (t.lt(lo) || t.gt(hi))
  const discount = (terms: Dec[]): Map<string, Dec | string> => {
    const out = new Map<string, Dec | string>()
    const inside = terms.filter(t => !outside(t))
    const values = inside.length ? evaluateValues(core, inside) : []
    inside.forEach((t, k) => {
      const y = values[k]!
      if (core.spec.kind === 'discount-factor') out.set(t.toString(), y)
      else if (rateInDomain(y, c)) out.set(t.toString(), fromSpot(t, y))
      else out.set(t.toString(), `spot rate ${y.toString()} at t = ${t.toString()} is not above ${c === 'annual' ? -1 : -2}`)
    })
    for (const t of terms) if (outside(t)) out.set(t.toString(), `t = ${t.toString()} lies outside the knots [${lo.toString()}, ${hi.toString()}] and extrapolation is 'error'`)
    return out
  }
  const figures: MoneyFigure[] = []
  const keyTerms = core.spec.money.keyTerms.map(t => new D(t))
  const keyP = discount(keyTerms)
  let prevT = new D(0)
  let prevP: Dec | string = new D(1)
  for (const t of keyTerms) {
    const p = keyP.get(t.toString())!
    figures.push(typeof p === 'string'
      ? { key: `P(${t})`, label: `Discount factor P(${t})`, value: null, reason: p }
      : { key: `P(${t})`, label: `Discount factor P(${t})`, value: roundTo(p, P).toString() })
    const key = `fwd(${prevT},${t})`
    const label = `Forward rate ${prevT}-${t} (${c} compounding)`
    if (typeof p === 'string' || typeof prevP === 'string') figures.push({ key, label, value: null, reason: typeof p === 'string' ? p : prevP as string })
    else if (!p.gt(0)) figures.push({ key, label, value: null, reason: `P(${t}) is not positive` })
    else figures.push({ key, label, value: roundTo(forward(prevP, p, t.minus(prevT)), P).toString() })
    prevT = t
    prevP = p
  }
  const maxN = Math.max(...core.spec.money.annuityTerms)
  const years = Array.from({ length: maxN }, (_, k) => new D(k + 1))
  const yearP = discount(years)
  for (const N of core.spec.money.annuityTerms) {
    let pv = new D(0)
    let weighted = new D(0)
    let problem: string | null = null
    for (let k = 1; k <= N && !problem; k += 1) {
      const p = yearP.get(String(k))!
      if (typeof p === 'string') problem = p
      else {
        pv = pv.plus(p)
        weighted = weighted.plus(p.times(k))
      }
    }
    const labelPv = `Present value of 1 a year for ${N} years (in arrears)`
    const labelD = `Macaulay duration of that annuity (years)`
    if (problem) {
      figures.push({ key: `annuity(${N})`, label: labelPv, value: null, reason: problem }, { key: `duration(${N})`, label: labelD, value: null, reason: problem })
      continue
    }
    figures.push({ key: `annuity(${N})`, label: labelPv, value: roundTo(pv, P).toString() })
    figures.push({ key: `duration(${N})`, label: labelD, value: pv.isZero() ? null : roundTo(weighted.div(pv), P).toString(), ...(pv.isZero() ? { reason: 'present value is zero' } : {}) })
  }
  return { basis: 'curve', available: figures.some(f => f.value !== null), figures }
}
