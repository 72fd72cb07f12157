import type { CompareResponseDto } from '#shared/types/fills'
import { entryStyles, type SeriesStyle } from '~/utils/series-style'

export interface ChartSeries { name: string, points: [number, number][], style?: SeriesStyle }

/** Each filled method's style by label (utils/series-style.ts): the same in every chart of one comparison. */
export function comparisonStyles(res: CompareResponseDto): Map<string, SeriesStyle> {
  return entryStyles(res.result.entries.flatMap(e => (e.ok ? [{ label: e.label, method: e.result.spec.method }] : [])))
}

// Series for drawing only: decimal strings become floating point here and nowhere else (the grid shows the exact text).

// `scale` turns stored per-unit values into the unit on screen (100 for %, 1000 for per mille, 10000 for basis points).

/** Every method that filled, as (x, y) pairs. */
export function valueSeries(res: CompareResponseDto, scale = 1): ChartSeries[] {
  const styles = comparisonStyles(res)
  return res.result.entries.flatMap(e => (e.ok ? [{ name: e.label, style: styles.get(e.label), points: e.result.points.map(p => [Number(p.x), Number(p.y) * scale] as [number, number]) }] : []))
}

/** Each method minus the baseline, point by point. */
export function differenceSeries(res: CompareResponseDto, baseline: string, scale = 1): ChartSeries[] {
  const base = res.result.entries.find(e => e.label === baseline)
  if (!base || !base.ok) return []
  const by = base.result.points.map(p => Number(p.y))
  const styles = comparisonStyles(res)
  return res.result.entries.flatMap(e => (e.ok && e.label !== baseline
    ? [{ name: e.label, style: styles.get(e.label), points: e.result.points.map((p, k) => [Number(p.x), (Number(p.y) - by[k]!) * scale] as [number, number]) }]
    : []))
}

/**
 * Implied forward rate between consecutive grid terms in the table's compounding (Hull, Options, Futures and Other
 * Derivatives, ch. 4): with g = P(t1)/P(t2) and h = t2 - t1, annual g^(1/h) - 1, semi-annual 2 (g^(1/(2h)) - 1),
 * continuous ln(g) / h; P(t) = (1 + r)^-t, (1 + r/2)^-2t or e^(-r t) for spot rates, or the discount factor itself; drawn
 * at the start of each interval. The engine's forward check uses the same convention.
 */
export function forwardSeries(res: CompareResponseDto, scale = 1): ChartSeries[] {
  const c = res.compounding ?? 'annual'
  const spotDiscount = { 'annual': (t: number, r: number) => (1 + r) ** -t, 'semi-annual': (t: number, r: number) => (1 + r / 2) ** (-2 * t), 'continuous': (t: number, r: number) => Math.exp(-r * t) }[c]
  const discount = (t: number, y: number) => (res.kind === 'discount-factor' ? y : spotDiscount(t, y))
  const forward = { 'annual': (g: number, h: number) => g ** (1 / h) - 1, 'semi-annual': (g: number, h: number) => 2 * (g ** (1 / (2 * h)) - 1), 'continuous': (g: number, h: number) => Math.log(g) / h }[c]
  const styles = comparisonStyles(res)
  return res.result.entries.flatMap((e) => {
    if (!e.ok) return []
    const pts = e.result.points.map(p => [Number(p.x), Number(p.y)] as const)
    const out: [number, number][] = []
    for (let k = 0; k + 1 < pts.length; k += 1) {
      const [t1, y1] = pts[k]!
      const [t2, y2] = pts[k + 1]!
      if (t2 > t1) out.push([t1, forward(discount(t1, y1) / discount(t2, y2), t2 - t1) * scale])
    }
    return [{ name: e.label, style: styles.get(e.label), points: out }]
  })
}

export function knotPoints(res: CompareResponseDto, scale = 1): [number, number][] {
  return res.knots.map(k => [Number(k.x), Number(k.y) * scale])
}
