import type { Diagnostics, Span } from '#shared/types/fills'

export interface CheckRow { id: string, name: string, meaning: string, verdict: (d: Diagnostics) => { good: boolean, text: string } }

/** An abscissa in at most 6 significant digits (monthly terms are long decimals). */
const fx = (x: string) => String(Number(Number(x).toPrecision(6)))
const spans = (at: Span[], max = 4) => at.slice(0, max).map(s => (s.from === s.to ? fx(s.from) : `${fx(s.from)}–${fx(s.to)}`)).join(', ') + (at.length > max ? ', …' : '')
const short = (v: string) => String(Number(Number(v).toPrecision(3)))

/** The checks of docs/domain.md#checks, each with a plain-language line on what it means and why it matters. */
export function checkRows(curve: boolean): CheckRow[] {
  const rows: CheckRow[] = [
    {
      id: 'knots', name: 'Passes through the given points',
      meaning: 'An interpolated table must return the values you were given at their own ages or terms, or it silently changes the basis.',
      verdict: d => (d.knotsReproduced ? { good: true, text: 'Every given point reproduced.' } : { good: false, text: `Misses by up to ${short(d.maxKnotDeviation)} at ${fx(d.maxKnotDeviationAt ?? '')}.` }),
    },
    {
      id: 'zigzag', name: 'Zig-zag (bending changes direction)',
      meaning: 'Each change in the sign of the curvature is a wiggle the data did not ask for; it moves single-age rates up and down and with them reserves.',
      verdict: d => (d.curvatureSignChanges.count === 0
        ? { good: true, text: 'Bends one way throughout.' }
        : { good: d.curvatureSignChanges.count <= 1, text: `${d.curvatureSignChanges.count} change${d.curvatureSignChanges.count === 1 ? '' : 's'}, at ${spans(d.curvatureSignChanges.at)}.` }),
    },
    {
      id: 'roughness', name: 'Roughness',
      meaning: 'Sums of squared 2nd and 3rd differences of the filled values: smaller is smoother. Compare methods with each other, not with a fixed bar.',
      verdict: d => ({ good: true, text: `2nd ${short(d.roughness.secondDifferences)}, 3rd ${short(d.roughness.thirdDifferences)}` }),
    },
    {
      id: 'monotone', name: 'Rises and falls like the data',
      meaning: 'A fill that turns where the given points do not (say q_x falling between two rising points) invents a feature of the experience.',
      verdict: d => (d.monotonicity.fillTurningPoints <= d.monotonicity.knotTurningPoints
        ? { good: true, text: `${d.monotonicity.fillTurningPoints} turn${d.monotonicity.fillTurningPoints === 1 ? '' : 's'}, as the data (${d.monotonicity.knotDirection}).` }
        : { good: false, text: `${d.monotonicity.fillTurningPoints} turns where the data have ${d.monotonicity.knotTurningPoints}, at ${d.monotonicity.at.slice(0, 4).map(fx).join(', ')}${d.monotonicity.at.length > 4 ? ', …' : ''}.` }),
    },
    {
      id: 'range', name: 'Values in range',
      meaning: 'A rate outside its possible range (q below 0 or above 1, a negative lapse rate) breaks every calculation that uses it.',
      verdict: d => (d.outOfRange.count === 0 ? { good: true, text: `All within ${d.outOfRange.rule}.` } : { good: false, text: `${d.outOfRange.count} outside ${d.outOfRange.rule}, first at ${d.outOfRange.first.map(p => fx(p.x)).slice(0, 3).join(', ')}.` }),
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
          text: `Raising the point at ${fx(b.at)} by ${short(b.size)} ${reach}; largest change ${short(b.ratio)}× the bump${Number(b.ratio) > 1 ? ' (overshoot)' : ''}.`,
        }
      },
    },
  ]
  if (curve) {
    rows.push({
      id: 'forwards', name: 'Forward rates',
      meaning: 'Negative or jumping forwards mean the curve prices a future period implausibly; practitioners ask for positive, continuous forwards (Hagan and West 2006).',
      verdict: (d) => {
        const f = d.forwards
        if (!f || !f.minimum) return { good: true, text: 'No forwards to check.' }
        const jump = f.largestJump ? `; largest jump ${short(f.largestJump.value)} at ${fx(f.largestJump.at)}` : ''
        return { good: f.negativeCount === 0, text: `Lowest ${short(f.minimum.value)} (${fx(f.minimum.from)}–${fx(f.minimum.to)}); ${f.negativeCount} negative${jump}.` }
      },
    })
  }
  return rows
}
