import type { CompareResponseDto } from '#shared/types/fills'

export interface ChartSeries { name: string, points: [number, number][] }

// Series for drawing only: decimal strings become floating point here and nowhere else (the grid shows the exact text).

// `scale` turns stored per-unit values into the unit on screen (100 for %, 1000 for per mille, 10000 for basis points).

/** Every method that filled, as (x, y) pairs. */
export function valueSeries(res: CompareResponseDto, scale = 1): ChartSeries[] {
  return res.result.entries.flatMap(e => (e.ok ? [{ name: e.label, points: e.result.points.map(p => [Number(p.x), Number(p.y) * scale] as [number, number]) }] : []))
}

/** Each method minus the baseline, point by point. */
export function differenceSeries(res: CompareResponseDto, baseline: string, scale = 1): ChartSeries[] {
  const base = res.result.entries.find(e => e.label === baseline)
  if (!base || !base.ok) return []
  const by = base.result.points.map(p => Number(p.y))
  return res.result.entries.flatMap(e => (e.ok && e.label !== baseline
    ? [{ name: e.label, points: e.result.points.map((p, k) => [Number(p.x), (Number(p.y) - by[k]!) * scale] as [number, number]) }]
    : []))
}

/**
 * Implied annual forward rate between consecutive grid terms, f = (P(t1)/P(t2))^(1/(t2 - t1)) - 1,
 * with P(t) = (1 + r(t))^-t for annual spot rates (Hull, Options, Futures and Other Derivatives, ch. 4), or the
 * discount factor itself; drawn at the start of each interval. The engine's forward check uses the same convention.
 */
export function forwardSeries(res: CompareResponseDto, scale = 1): ChartSeries[] {
  const discount = (t: number, y: number) => (res.kind === 'discount-factor' ? y : (1 + y) ** -t)
  return res.result.entries.flatMap((e) => {
    if (!e.ok) return []
    const pts = e.result.points.map(p => [Number(p.x), Number(p.y)] as const)
    const out: [number, number][] = []
    for (let k = 0; k + 1 < pts.length; k += 1) {
      const [t1, y1] = pts[k]!
      const [t2, y2] = pts[k + 1]!
      if (t2 > t1) out.push([t1, ((discount(t1, y1) / discount(t2, y2)) ** (1 / (t2 - t1)) - 1) * scale])
    }
    return [{ name: e.label, points: out }]
  })
}

export function knotPoints(res: CompareResponseDto, scale = 1): [number, number][] {
  return res.knots.map(k => [Number(k.x), Number(k.y) * scale])
}
