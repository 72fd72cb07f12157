import type { Axis } from '#shared/tables'

// How axis values and table values read on screen (the exact text stays in the grid and in titles).

/** An axis value as people read it: terms on a monthly grid as years and months ("0.3333 (4 m)"), not 0.333333333333. */
export function axisText(x: string, axis: Axis): string {
  return axis === 'term' && x.length > 8 ? `${Number(Number(x).toFixed(4))} (${Math.round(Number(x) * 12)} m)` : x
}

/** A value shown with 9 significant digits unless every digit is asked for (the exact text stays in the title). */
export function shortValue(exact: string, every: boolean): string {
  return every ? exact : String(Number(Number(exact).toPrecision(9)))
}
