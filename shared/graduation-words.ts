// The fit tests of a graduation in words a reviewer reads (London, Graduation, 1985, ch. 2; Forfar, McCutcheon and Wilkie,
// JIA 115, 1988, section 3). A test "looks fine" when its p-value is at least 5 % (common practice), or, for the
// deviations, when no more than about 1 in 20 lies beyond 2 in size and none beyond 3.
import type { GraduationDiagnostics } from './engine/contract'

export interface GraduationTestRow { id: string, name: string, meaning: string, good: boolean | null, text: string }

const p = (v: string) => `${String(Number((Number(v) * 100).toPrecision(2)))} %`
const n3 = (v: string | number) => String(Number(Number(v).toPrecision(3)))
const plural = (n: number, one: string, many = `${one}s`) => `${n} ${n === 1 ? one : many}`
const SIGNIFICANT = 0.05

export const ORDER_WORDS: Record<number, string> = {
  1: 'Order 1: penalise slopes (pulls toward a constant)',
  2: 'Order 2: penalise bends (pulls toward a straight line)',
  3: 'Order 3: penalise changes of bend (pulls toward a parabola; Whittaker\u2019s choice)',
  4: 'Order 4: pulls toward a cubic',
  5: 'Order 5: pulls toward a quartic',
  6: 'Order 6: pulls toward a quintic',
}

export function graduationTestRows(d: GraduationDiagnostics): GraduationTestRow[] {
  const z = d.deviations.values.map(v => ({ x: v.x, z: Number(v.value) }))
  const beyond2 = z.filter(v => Math.abs(v.z) > 2).length
  const beyond3 = z.filter(v => Math.abs(v.z) > 3).length
  const largest = z.reduce((m, v) => (Math.abs(v.z) > Math.abs(m.z) ? v : m), z[0] ?? { x: '', z: 0 })
  return [
    {
      id: 'deviations', name: d.deviations.standardised ? 'Standardised deviations' : 'Deviations (weighted, not standardised)',
      meaning: d.deviations.standardised
        ? 'Actual minus expected deaths over their standard deviation, age by age. About 1 in 20 beyond 2 in size is what chance gives; beyond 3 is rare.'
        : 'Crude minus graduated value times the square root of its weight. Without deaths and exposures these are not on a standard scale: read their pattern, not their size.',
      good: d.deviations.standardised ? beyond3 === 0 && beyond2 <= Math.max(1, Math.ceil(z.length / 20)) : null,
      text: `Largest ${n3(largest.z)} at ${largest.x}${d.deviations.standardised ? `; ${plural(beyond2, 'deviation')} beyond 2, ${beyond3} beyond 3, of ${z.length}` : ''}.`,
    },
    {
      id: 'chi-square', name: 'Chi-square against expected deaths',
      meaning: 'The sum of squared standardised deviations: too large means the graduation does not follow the experience.',
      good: d.chiSquare ? Number(d.chiSquare.pValue) >= SIGNIFICANT : null,
      text: d.chiSquare
        ? `${n3(d.chiSquare.statistic)} on ${n3(d.chiSquare.degreesOfFreedom)} degrees of freedom; a worse fit would arise by chance ${p(d.chiSquare.pValue)} of the time.`
        : 'Needs deaths and exposures for every age (map those columns when importing).',
    },
    {
      id: 'signs', name: 'Signs of the deviations',
      meaning: 'A graduation that lies mostly above (or below) the crude rates is biased.',
      good: Number(d.signs.pValue) >= SIGNIFICANT,
      text: `${d.signs.positive} above, ${d.signs.negative} below; as uneven or more by chance ${p(d.signs.pValue)} of the time.`,
    },
    {
      id: 'runs', name: 'Runs of one sign',
      meaning: 'Long runs of deviations of one sign mean the graduation misses the shape of the experience over a range of ages.',
      good: Number(d.runs.pValue) >= SIGNIFICANT,
      text: `${plural(d.runs.runs, 'run')}, ${plural(d.runs.positiveGroups, 'group')} above; this few groups or fewer by chance ${p(d.runs.pValue)} of the time.`,
    },
    {
      id: 'smoothness', name: 'Smoothness',
      meaning: `Sum of squared differences of order ${d.smoothness.order} (what the smoothing penalises): graduated against crude. Smaller is smoother.`,
      good: Number(d.smoothness.graduated) <= Number(d.smoothness.crude),
      text: `Graduated ${n3(d.smoothness.graduated)}, crude ${n3(d.smoothness.crude)}${Number(d.smoothness.graduated) > 0 ? ` (${n3(Number(d.smoothness.crude) / Number(d.smoothness.graduated))} times smoother)` : ''}; sum of squared third differences ${n3(d.smoothness.thirdDifferences)}.`,
    },
    {
      id: 'parameters', name: 'Parameters spent',
      meaning: 'How many free values the graduation effectively uses: the order when the smoothing is very large, every age when it is 0.',
      good: null,
      text: `${n3(d.effectiveParameters)} of ${z.length}.`,
    },
  ]
}
