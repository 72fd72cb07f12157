// Band (group) axis values as spreadsheets write them: "55-59", "55 - 59", "55–59" (en dash), "55 to 59" (inclusive whole
// years) and "[55, 60)" (half-open: 55 up to but not including 60), "[55, 59]" (closed). A band is returned as its first
// and last whole year, inclusive: all of these are { from: '55', to: '59' }.
import type { SplitMethodId } from './engine/contract'

export interface Band { from: string, to: string }

const INCLUSIVE = /^\s*(\d{1,3})\s*(?:-|–|—|to)\s*(\d{1,3})\s*$/i
const INTERVAL = /^\s*\[\s*(\d{1,3})\s*[,;]\s*(\d{1,3})\s*([)\]])\s*$/

/** The band a cell names, or null when it is not a band of whole years (a plain number is not a band). */
export function parseBand(text: string | null | undefined): Band | null {
  if (!text) return null
  const inclusive = INCLUSIVE.exec(text)
  const interval = inclusive ? null : INTERVAL.exec(text)
  if (!inclusive && !interval) return null
  const from = Number((inclusive ?? interval)![1])
  const to = inclusive ? Number(inclusive[2]) : Number(interval![2]) - (interval![3] === ')' ? 1 : 0)
  return to > from ? { from: String(from), to: String(to) } : null
}

/** The middle of a band of whole years, where a rate for the whole band is placed: 55-59 covers [55, 60), middle 57.5. */
export function bandMiddle(b: Band): string {
  const twice = Number(b.from) + Number(b.to) + 1
  return twice % 2 === 0 ? String(twice / 2) : `${(twice - 1) / 2}.5`
}

/** What the values of a band axis are: totals (deaths, exposures, lives: split into single years) or rates for the band. */
export const BAND_VALUE_KINDS = ['totals', 'rates'] as const
export type BandValues = (typeof BAND_VALUE_KINDS)[number]

export const SPLIT_WORDS: Record<SplitMethodId, string> = {
  'sprague': 'Sprague (fifth differences; needs 4 or more bands)',
  'beers': 'Beers ordinary (six-term; needs 5 or more bands)',
  'karup-king': 'Karup-King (third differences; needs 2 or more bands)',
}
