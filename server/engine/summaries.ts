import { roundTo, type Dec } from './decimal'
import type { CoreFill } from './pipeline'
import type { MoneyFigure, MoneyImpact } from './types'

// Money-free summaries for tables whose effect is not a money figure on its own: what a lapse table does to a block of
// policies, and how far a salary scale lifts salaries. Both read the fill at whole years (policy years or ages).

const PER = 1000

/** Values of the fill at every whole x from the first to the last, or a reason why there are gaps. */
function wholeYears(core: CoreFill): { first: number, last: number, at: Map<number, Dec> } | string {
  const at = new Map<number, Dec>()
  core.points.xs.forEach((x, k) => { if (x.isInteger() && x.abs().lte(1000)) at.set(x.toNumber(), core.values[k]!) })
  if (at.size < 2) return 'The fill needs a whole-year grid (step 1 or a divisor of 1) for this summary.'
  const years = [...at.keys()].sort((a, b) => a - b)
  const first = years[0]!
  const last = years[years.length - 1]!
  for (let y = first; y <= last; y += 1) if (!at.has(y)) return `The fill has no value at ${y}; the summary needs every whole year from ${first} to ${last}.`
  return { first, last, at }
}

/**
 * In force after n policy years out of 1,000 at the start of the first: N_t = N_{t-1} (1 - w_t), the rate w_t acting over
 * policy year t as a single decrement (Dickson, Hardy and Waters, AMLCR, multiple decrement models: survival in force is
 * the product of (1 - q) over the years). Shown after 1, 5, 10 and 20 years where the fill reaches.
 */
export function lapseSummary(core: CoreFill): MoneyImpact {
  const years = wholeYears(core)
  if (typeof years === 'string') return { basis: 'persistency', available: false, reason: years, figures: [] }
  const D = core.D
  const figures: MoneyFigure[] = []
  let inForce = new D(PER)
  for (let t = years.first; t <= years.last; t += 1) {
    inForce = inForce.times(new D(1).minus(years.at.get(t)!))
    const n = t - years.first + 1
    if ([1, 5, 10, 20].includes(n)) figures.push({ key: `in-force(${n})`, label: `Policies still in force after ${n} year${n === 1 ? '' : 's'}, of ${PER.toLocaleString('en-GB')} at the start`, value: roundTo(inForce, core.spec.precision).toString() })
  }
  return { basis: 'persistency', available: figures.length > 0, figures }
}

/**
 * Salary growth along the scale: s_last / s_first, the salary at the last age per unit of salary at the first (the salary
 * scale ratio of pension valuations, Dickson, Hardy and Waters, AMLCR, pension mathematics), and the average yearly
 * growth (s_last / s_first)^(1 / (last - first)) - 1; also s_{x+10} / s_x from the first age.
 */
export function salarySummary(core: CoreFill): MoneyImpact {
  const years = wholeYears(core)
  if (typeof years === 'string') return { basis: 'salary', available: false, reason: years, figures: [] }
  const P = core.spec.precision
  const first = years.at.get(years.first)!
  if (!first.gt(0)) return { basis: 'salary', available: false, reason: `The salary scale at ${years.first} is not above 0.`, figures: [] }
  const ratio = years.at.get(years.last)!.div(first)
  const span = years.last - years.first
  const figures: MoneyFigure[] = [
    { key: 'growth', label: `Salary at ${years.last} per unit of salary at ${years.first}`, value: roundTo(ratio, P).toString() },
    { key: 'yearly', label: `Average yearly growth from ${years.first} to ${years.last}`, value: ratio.gt(0) ? roundTo(ratio.pow(new core.D(1).div(span)).minus(1), P).toString() : null, ...(ratio.gt(0) ? {} : { reason: 'the ratio is not above 0' }) },
  ]
  if (span >= 10) figures.push({ key: 'decade', label: `Salary at ${years.first + 10} per unit of salary at ${years.first}`, value: roundTo(years.at.get(years.first + 10)!.div(first), P).toString() })
  return { basis: 'salary', available: true, figures }
}
