import { D, canonicalDecimal } from '#shared/decimal-text'
import { bandMiddle, type Band } from '#shared/bands'
import { AXIS_LABELS } from '#shared/tables'
import type { ImportMapping } from '#shared/schemas/imports'
import type { BandSummary, ImportFinding, PointDto } from '#shared/types/tables'
import { EngineError, split } from '../../engine/index'

// An axis of bands ("55-59") on import: the person says whether the values are totals for each band (deaths, exposures,
// lives), which are split into single years with each band's total kept (the engine's split), or rates for the whole
// band, which are kept as one point at the band's middle. Nothing is split until they have said which.

export interface BandValue { band: Band, value: string, row: number }
type Add = (severity: ImportFinding['severity'], code: string, row: number | null, col: number | null, text: string) => void

/** Significant digits of each band's total that the split keeps (the single-year values are given to that last digit). */
export const SPLIT_DIGITS = 12
const PROBABILITIES = ['mortality', 'lapse']
const label = (b: Band) => `${b.from}–${b.to}`

/** The points of each value column, the findings, and the summary the preview shows (null answer: only the question). */
export function resolveBands(m: ImportMapping, columns: BandValue[][], add: Add): { points: PointDto[][], summary: BandSummary } {
  const all = columns.flatMap(c => c).map(v => v.band)
  const first = all.reduce((a, b) => (Number(b.from) < Number(a.from) ? b : a), all[0]!)
  const last = all.reduce((a, b) => (Number(b.from) > Number(a.from) ? b : a), all[0]!)
  const widths = [...new Set(all.map(b => Number(b.to) - Number(b.from) + 1))]
  const axisName = AXIS_LABELS[m.axis].toLowerCase()
  const summary: BandSummary = { count: new Set(all.map(b => b.from)).size, first: label(first), last: label(last), widths, answer: m.bands ?? null, digits: SPLIT_DIGITS, checks: [] }
  if (!m.bands) {
    add('error', 'bands-unanswered', null, m.axisColumn, `the ${axisName} column holds bands (${label(first)} … ${label(last)}), not single values. Say whether the values are totals for each band (to be split into single years) or rates for the whole band.`)
    return { points: columns.map(() => []), summary }
  }
  if (m.bands.values === 'rates') {
    return { points: columns.map(c => c.map(v => ({ x: bandMiddle(v.band), y: v.value }))), summary }
  }
  const points = columns.map((values, i) => {
    const col = m.columns[i]!
    if (PROBABILITIES.includes(col.kind)) {
      add('error', 'bands-totals-kind', null, col.index, `"${col.name}" holds totals, which are not ${col.kind === 'mortality' ? 'q_x' : 'rates'}: choose the kind Other for deaths, exposures or lives, or say the values are rates.`)
      return []
    }
    if (!values.length) return []
    try {
      const r = split({ groups: values.map(v => ({ from: v.band.from, to: v.band.to, total: v.value })), method: m.bands!.split, precision: SPLIT_DIGITS })
      for (const n of r.diagnostics.negatives.first) add('warning', 'split-negative', null, col.index, `"${col.name}": the split gives ${n.value} at ${n.x}, below zero; a total cannot have negative parts. Try another method.`)
      // the check the preview shows: each band's single-year values added up again here, exactly, against its total
      for (const v of values) {
        const inside = r.points.filter(p => Number(p.x) >= Number(v.band.from) && Number(p.x) <= Number(v.band.to))
        const sum = inside.reduce((s, p) => s.plus(p.y), new D(0))
        if (summary.checks.length < 200) summary.checks.push({ column: col.name, band: label(v.band), total: v.value, sum: canonicalDecimal(sum), kept: sum.eq(v.value) })
      }
      return r.points.map(p => ({ x: canonicalDecimal(p.x), y: canonicalDecimal(p.y) }))
    }
    catch (e) {
      if (!(e instanceof EngineError)) throw e
      add('error', 'split-refused', null, col.index, `"${col.name}" cannot be split: ${e.message}`)
      return []
    }
  })
  return { points, summary }
}
