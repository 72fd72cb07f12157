import { METHOD_IDS, type MethodId } from '#shared/engine/contract'

// One look per method on every chart of the bench (values, differences, forward rates) and wherever methods are drawn.
// Eight colours of our own, chosen so that every pair stays apart by at least SERIES_MIN_DISTANCE (CIE76 ΔE in CIELAB)
// for normal vision and under simulated protanopia and deuteranopia (Machado, Oliveira and Fernandes 2009, severity 1;
// tests/unit/series-style.test.ts checks it), and each with a contrast of at least 3:1 against white and against the
// dark page colour #1b1f1d (WCAG 2.1, 1.4.11 non-text contrast), so they read in a light and a dark theme alike.
export const SERIES_COLOURS = ['#3c96ff', '#b44b1e', '#3ca587', '#ff1e69', '#2d5af0', '#7896b4', '#c38700', '#a53cb4'] as const
export const SERIES_MIN_DISTANCE = 20

/** Dash patterns, the second cue beside the colour: solid, dashed, dotted, dash-dot (ECharts lineStyle.type). */
export const SERIES_DASHES: readonly ('solid' | number[])[] = ['solid', [7, 4], [2, 3], [9, 3, 2, 3]]
export const DASH_WORDS = ['solid', 'dashed', 'dotted', 'dash-dot'] as const

export interface SeriesStyle { colour: string, dash: 'solid' | number[], dashIndex: number }

function slotStyle(slot: number): SeriesStyle {
  const dashIndex = (slot + Math.floor(slot / SERIES_COLOURS.length)) % SERIES_DASHES.length
  return { colour: SERIES_COLOURS[slot % SERIES_COLOURS.length]!, dash: SERIES_DASHES[dashIndex]!, dashIndex }
}

/**
 * The style of a method, by its place in METHOD_IDS (a fixed order), so it keeps it whatever subset is drawn. Thirteen
 * methods share eight colours: no two methods share both colour and dash. `occurrence` (0 for the first entry of that
 * method in a comparison, 1 for the second with other options...) moves the dash on, so two entries of one method differ.
 */
export function methodStyle(method: MethodId, occurrence = 0): SeriesStyle {
  const base = slotStyle(METHOD_IDS.indexOf(method))
  if (occurrence === 0) return base
  const dashIndex = (base.dashIndex + occurrence) % SERIES_DASHES.length
  return { ...base, dash: SERIES_DASHES[dashIndex]!, dashIndex }
}

/** Styles for series that are not methods (a graduation, its deviations, a table's columns): by position. */
export function positionStyle(k: number): SeriesStyle {
  return slotStyle(k)
}

/** Style of each entry of a comparison, keyed by its label, counted over all entries (so every chart agrees). */
export function entryStyles(entries: { label: string, method: MethodId }[]): Map<string, SeriesStyle> {
  const seen = new Map<MethodId, number>()
  const out = new Map<string, SeriesStyle>()
  for (const e of entries) {
    const n = seen.get(e.method) ?? 0
    seen.set(e.method, n + 1)
    out.set(e.label, methodStyle(e.method, n))
  }
  return out
}

/** The ECharts line style and item colour of a series. */
export function echartsLine(style: SeriesStyle, width = 1.8) {
  return { lineStyle: { color: style.colour, width, type: style.dash }, itemStyle: { color: style.colour } }
}
