// The checks of a fill (docs/domain.md#checks) in plain words, with values in the table's unit: one wording for the fill
// bench, the table page and the signed workbook. Each row says what the check means and why it matters.
import type { ClosureReport, ConvergenceReport, Diagnostics, Span } from './engine/contract'
import { UNIT_SCALE } from './decimal-text'
import type { TableKind, ValueUnit } from './tables'

export interface CheckRow { id: string, name: string, meaning: string, verdict: (d: Diagnostics) => { good: boolean, text: string } }

/** An abscissa in at most 6 significant digits (monthly terms are long decimals). */
const fx = (x: string) => String(Number(Number(x).toPrecision(6)))
const spans = (at: Span[], max = 4) => at.slice(0, max).map(s => (s.from === s.to ? fx(s.from) : `${fx(s.from)}–${fx(s.to)}`)).join(', ') + (at.length > max ? ', …' : '')
const short = (v: number) => String(Number(v.toPrecision(3)))
const SUFFIX: Record<ValueUnit, string> = { 'per-unit': '', 'percent': '%', 'per-mille': '‰', 'basis-points': ' bp' }
/** A per-unit value (or difference of values) in the table's unit, 3 significant digits: "0.0236‰". */
export function inUnit(perUnit: string | number, unit: ValueUnit): string {
  return `${short(Number(perUnit) * UNIT_SCALE[unit])}${SUFFIX[unit]}`
}
const RANGES: Partial<Record<TableKind, (u: ValueUnit) => string>> = {
  'mortality': u => `q from ${inUnit(0, u)} to ${inUnit(1, u)}`,
  'lapse': u => `rates from ${inUnit(0, u)} to ${inUnit(1, u)}`,
  'spot-rate': u => `rates of ${inUnit(0, u)} or more (negative rates are flagged)`,
  'discount-factor': () => 'discount factors above 0 and at most 1',
  'salary': () => 'salary scale values above 0',
}
const plural = (n: number, one: string, many = `${one}s`) => `${n} ${n === 1 ? one : many}`

/** The checks shown for a table of this kind; values read in `unit`. */
export function checkRows(kind: TableKind, unit: ValueUnit = 'per-unit'): CheckRow[] {
  const v = (x: string | number) => inUnit(x, unit)
  const range = RANGES[kind]?.(unit) ?? 'no range rule for this kind of table'
  const rows: CheckRow[] = [
    {
      id: 'knots', name: 'Passes through the given points',
      meaning: 'An interpolated table must return the values you were given at their own ages or terms, or it silently changes the basis.',
      verdict: d => (d.knotsReproduced ? { good: true, text: 'Every given point reproduced.' } : { good: false, text: `Misses by up to ${v(d.maxKnotDeviation)} at ${fx(d.maxKnotDeviationAt ?? '')}.` }),
    },
    {
      id: 'zigzag', name: 'Zig-zag (bending changes direction)',
      meaning: 'Each change in the sign of the curvature is a wiggle the data did not ask for; it moves single-age rates up and down and with them reserves.',
      verdict: d => (d.curvatureSignChanges.count === 0
        ? { good: true, text: 'Bends one way throughout.' }
        : { good: d.curvatureSignChanges.count <= 1, text: `${plural(d.curvatureSignChanges.count, 'change')}, at ${spans(d.curvatureSignChanges.at)}.` }),
    },
    {
      id: 'roughness', name: 'Roughness',
      meaning: 'Sums of squared 2nd and 3rd differences of the filled values (in the table\u2019s unit, squared): smaller is smoother. Compare methods with each other, not with a fixed bar.',
      verdict: d => ({ good: true, text: `2nd ${short(Number(d.roughness.secondDifferences) * UNIT_SCALE[unit] ** 2)}, 3rd ${short(Number(d.roughness.thirdDifferences) * UNIT_SCALE[unit] ** 2)}` }),
    },
    {
      id: 'monotone', name: 'Rises and falls like the data',
      meaning: 'A fill that turns where the given points do not (say q_x falling between two rising points) invents a feature of the experience.',
      verdict: d => (d.monotonicity.fillTurningPoints <= d.monotonicity.knotTurningPoints
        ? { good: true, text: `${plural(d.monotonicity.fillTurningPoints, 'turn')}, as the data (${d.monotonicity.knotDirection}).` }
        : { good: false, text: `${plural(d.monotonicity.fillTurningPoints, 'turn')} where the data have ${d.monotonicity.knotTurningPoints}, at ${d.monotonicity.at.slice(0, 4).map(fx).join(', ')}${d.monotonicity.at.length > 4 ? ', …' : ''}.` }),
    },
    {
      id: 'range', name: 'Values in range',
      meaning: 'A rate outside its possible range (q below 0 or above 1, a negative lapse rate) breaks every calculation that uses it.',
      verdict: d => (d.outOfRange.count === 0 ? { good: true, text: `All within ${range}.` } : { good: false, text: `${d.outOfRange.count} outside ${range}, first at ${d.outOfRange.first.map(p => fx(p.x)).slice(0, 3).join(', ')}.` }),
    },
    {
      id: 'bump', name: 'Reach of a bump',
      meaning: 'The middle given point is raised a little (1 basis point on a curve, 1 % elsewhere) and the method refitted. A local method moves the fill only near that point; Hagan and West (2006) count locality, and no overshoot of the bump, among the marks of a good curve.',
      verdict: (d) => {
        const b = d.bump
        if (!b) return { good: true, text: 'Needs three or more given points.' }
        const m = b.material
        const reach = m ? `moves ${m.intervals} of ${b.intervals} intervals (${fx(m.from)}–${fx(m.to)})` : 'moves no interval by 1 % of the bump'
        return {
          good: (m?.intervals ?? 0) <= 4 && Number(b.ratio) <= 1,
          text: `Raising the point at ${fx(b.at)} by ${v(b.size)} ${reach}; largest change ${short(Number(b.ratio))}× the bump${Number(b.ratio) > 1 ? ' (overshoot)' : ''}.`,
        }
      },
    },
  ]
  if (kind === 'spot-rate' || kind === 'discount-factor') {
    rows.push({
      id: 'forwards', name: 'Forward rates',
      meaning: 'Negative or jumping forwards mean the curve prices a future period implausibly; practitioners ask for positive, continuous forwards (Hagan and West 2006).',
      verdict: (d) => {
        const f = d.forwards
        const r = (x: string) => inUnit(x, kind === 'spot-rate' ? unit : 'percent')
        if (!f || !f.minimum) return { good: true, text: 'No forwards to check.' }
        const jump = f.largestJump ? `; largest jump ${r(f.largestJump.value)} at ${fx(f.largestJump.at)}` : ''
        return { good: f.negativeCount === 0, text: `Lowest ${r(f.minimum.value)} (${fx(f.minimum.from)}–${fx(f.minimum.to)}); ${f.negativeCount} negative${jump}.` }
      },
    })
  }
  return rows
}

/** A check's verdict, or a plain "not recorded" for fills saved before the check existed (older diagnostics). */
export function verdictOf(row: CheckRow, d: Diagnostics): { good: boolean, text: string } | null {
  try { return row.verdict(d) } catch { return null }
}

const LAW_NAMES: Record<ClosureReport['law'], string> = { gompertz: 'Gompertz law', kannisto: 'Kannisto law' }

/**
 * The old-age closure of a fill in words (not one of checkRows: that list is part of signed format 2). Good when the law
 * fits the oldest given ages within 5 % on the hazard scale and meets the last given age within a tenth of its q.
 */
export function closureVerdict(c: ClosureReport, unit: ValueUnit = 'per-unit'): { good: boolean, text: string } {
  const misfit = Number(c.maxLogHazardResidual)
  const step = Number(c.lawMinusGivenAtLastAge)
  const percent = Math.abs(Math.expm1(misfit)) * 100
  const fit = misfit === 0 ? 'fits them exactly' : percent < 0.01 ? 'fits them within 0.01 % of the hazard' : `fits them within ${short(percent)} % of the hazard`
  const join = step === 0 ? 'meets the last given age exactly' : `is ${inUnit(Math.abs(step), unit)} ${step > 0 ? 'above' : 'below'} the given q at the last given age`
  return {
    good: misfit <= 0.05,
    text: `${LAW_NAMES[c.law]} fitted to ${plural(c.fitAges, 'given age')} from ${fx(c.fitFrom)} to ${fx(c.fitTo)}: it ${fit} and ${join}; q reaches 1 at age ${fx(c.terminalAge)}.`,
  }
}

/** A continuously compounded intensity as a percentage, 4 decimals: "3.4401 %". */
const pct = (v: string) => `${(Number(v) * 100).toFixed(4)} %`
/** A gap of intensities in basis points, 6 significant digits (a calibrated alpha sits just inside 1 bp, one step lower just outside). */
const bp = (v: string) => `${String(Number((Number(v) * 10_000).toPrecision(6)))} bp`

/**
 * Smith-Wilson's convergence check in words (the regulator's rule: the forward at the convergence point within 1 basis point
 * of the ultimate forward intensity ln(1 + UFR), alpha at least 0.05). `calibrated`: alpha was 'auto'. Not one of checkRows
 * (that list is part of signed format 2).
 */
export function convergenceVerdict(c: ConvergenceReport, calibrated: boolean): { good: boolean, text: string } {
  const at = `At ${fx(c.convergencePoint)} years (the convergence point) the forward intensity is ${pct(c.forwardIntensity)} against the ultimate ${pct(c.ultimateIntensity)} (ln(1 + UFR)): ${bp(c.gap)} apart, ${c.met ? 'within' : 'more than'} the ${bp(c.tolerance)} allowed.`
  const alpha = calibrated
    ? `Alpha ${c.alpha}, calibrated: the smallest alpha of at least 0.05 for which the forward at the convergence point comes within ${bp(c.tolerance)} of the ultimate forward rate.`
    : `Alpha ${c.alpha}, as given.`
  const below = c.below
    ? ` One step lower, alpha ${c.below.alpha} would leave ${bp(c.below.gap)}${c.below.met ? ', also within the limit: a smaller alpha would do' : ', outside the limit: no smaller alpha passes'}.`
    : calibrated ? ' Alpha is at its floor of 0.05.' : ''
  return { good: c.met, text: `${alpha} ${at}${below}` }
}
