/**
 * Engine benchmark (run: npx tsx bench/engine.bench.ts, or npm run bench:engine). Prints figures; asserts nothing.
 * Setup: 121 knots at x = 0, 1.2, ..., 144 (a curve quoted every 1.2 months over 12 years), filled every 0.01 month
 * from 0 to 144: 14,401 points, precision 40 significant digits. For each method: median time of fit + evaluation
 * (the result strings included), points per second, and the efficiency ratio
 *   (time per point) / (time of the bare decimal operations a cubic Horner evaluation needs per point:
 *    1 sub + 3 mul + 3 add on Decimal at 40 digits, timed in the same run on the same operands).
 * Diagnostics and money are timed separately. Floats appear here only for timing.
 */
import { cpus, loadavg } from 'node:os'
import { setFlagsFromString } from 'node:v8'
import { runInNewContext } from 'node:vm'
import Decimal from 'decimal.js'
import { computeDiagnostics } from '../server/engine/diagnostics'
import { computeMoney } from '../server/engine/money'
import { evaluateAscending } from '../server/engine/evaluate'
import { fill2d, fill2dCore } from '../server/engine/fill2d'
import { fillCore, fitRequest } from '../server/engine/pipeline'
import { fill, graduate, split } from '../server/engine'
import type { Fill2DRequest, FillRequest, Knot2D, MethodId, TransformId } from '../server/engine/types'

const RUNS = 9
const KNOTS = 121
const D = Decimal.clone({ precision: 40, rounding: Decimal.ROUND_HALF_EVEN })

function median(values: number[]): number {
  const s = [...values].sort((a, b) => a - b)
  return s[Math.floor(s.length / 2)]!
}

// Collect garbage before each timed run so one run does not pay for the previous one's garbage.
setFlagsFromString('--expose-gc')
const collect = runInNewContext('gc') as () => void

function time(fn: () => void, runs = RUNS, warmUps = 1, gcFirst = true): number {
  for (let w = 0; w < warmUps; w += 1) fn() // warm-up
  const t: number[] = []
  for (let r = 0; r < runs; r += 1) {
    if (gcFirst) collect()
    const t0 = performance.now()
    fn()
    t.push(performance.now() - t0)
  }
  return median(t)
}

// Knots: a smooth rising curve r(x) = 0.02 + 0.015 (1 - exp(-x / 40)) + 0.002 sin(x / 9), 8 significant digits.
const knots = Array.from({ length: KNOTS }, (_, i) => {
  const x = new D(i).times('1.2')
  const r = new D('0.02').plus(new D('0.015').times(new D(1).minus(x.div(40).neg().exp()))).plus(new D('0.002').times(x.div(9).sin()))
  return { x: x.toString(), y: r.toSD(8).toString() }
})
const base: FillRequest = { knots, method: 'cubic-natural', grid: { from: '0', to: '144', step: '0.01' }, precision: 40, kind: 'other' }

// Baseline: 1 sub + 3 mul + 3 add per point on the natural spline's own coefficients, at 40 digits, piece located beforehand.
const core = fillCore(base)
const N = core.points.xs.length
const coefs = core.pp.coefs.map(c => c.map(v => new D(v.toSD(40))))
const starts = core.pp.breaks.map(b => new D(b))
const pieceOf: number[] = []
const xs40 = core.points.xs.map(x => new D(x))
{
  let i = 0
  for (const x of xs40) {
    while (i < coefs.length - 1 && x.gte(starts[i + 1]!)) i += 1
    pieceOf.push(i)
  }
}
function baselineRun(): void {
  for (let k = 0; k < N; k += 1) {
    const c = coefs[pieceOf[k]!]!
    const t = xs40[k]!.minus(starts[pieceOf[k]!]!)
    c[3]!.times(t).plus(c[2]!).times(t).plus(c[1]!).times(t).plus(c[0]!)
  }
}

/** Time fn and the baseline in alternate runs (the machine may be shared: adjacent runs see the same load). Medians and minima. */
function timeAgainstBaseline(fn: () => void, runs = RUNS): { ms: number, baseline: number, msMin: number, baselineMin: number } {
  fn()
  baselineRun()
  const a: number[] = []
  const b: number[] = []
  for (let r = 0; r < runs; r += 1) {
    collect()
    let t0 = performance.now()
    baselineRun()
    b.push(performance.now() - t0)
    collect()
    t0 = performance.now()
    fn()
    a.push(performance.now() - t0)
  }
  return { ms: median(a), baseline: median(b), msMin: Math.min(...a), baselineMin: Math.min(...b) }
}

const baselineMs = time(baselineRun, 15)

const methods: MethodId[] = ['linear', 'log-linear', 'quadratic', 'cubic-natural', 'cubic-clamped', 'cubic-not-a-knot', 'pchip', 'akima', 'karup-king', 'sprague', 'beers']
const rows: string[][] = []
function row(method: MethodId, transform: TransformId, runs: number, withChecks: boolean): void {
  const request: FillRequest = { ...base, method, transform }
  // a grid resolved each time, as a single fill does (compare() shares one between methods)
  const t = timeAgainstBaseline(() => fillCore(request), runs)
  let checks = '-'
  if (withChecks) {
    const core = fillCore(request)
    checks = time(() => { computeDiagnostics(core); computeMoney(core) }, 3).toFixed(1)
  }
  rows.push([
    method, transform,
    `${t.ms.toFixed(1)} (${t.msMin.toFixed(1)})`,
    Math.round(N / (t.ms / 1000)).toLocaleString('en-GB'),
    `${t.baseline.toFixed(1)} (${t.baselineMin.toFixed(1)})`,
    `${(t.ms / t.baseline).toFixed(2)} (${(t.msMin / t.baselineMin).toFixed(2)})`,
    checks,
  ])
}
for (const method of methods) row(method, 'none', RUNS, true)
for (const transform of ['log', 'logit', 'cumulative-hazard'] as TransformId[]) row('cubic-natural', transform, 3, false)

// Curve methods and the two-way fill (issue 16). Same knots read as spot rates (annual unless said), same grid.
const ratioRow = (label: string, detail: string, t: { ms: number, baseline: number, msMin: number, baselineMin: number }, points: number, checks = '-') => {
  // the baseline is timed on N points; a row with another number of points is compared per point
  const scale = points / N
  rows.push([label, detail, `${t.ms.toFixed(1)} (${t.msMin.toFixed(1)})`, Math.round(points / (t.ms / 1000)).toLocaleString('en-GB'),
    `${(t.baseline * scale).toFixed(1)} (${(t.baselineMin * scale).toFixed(1)})`,
    `${(t.ms / (t.baseline * scale)).toFixed(2)} (${(t.msMin / (t.baselineMin * scale)).toFixed(2)})`, checks])
}
const curveRow = (label: string, detail: string, request: FillRequest, runs: number) => {
  const t = timeAgainstBaseline(() => fillCore(request), runs)
  const core = fillCore(request)
  ratioRow(label, detail, t, N, time(() => { computeDiagnostics(core); computeMoney(core) }, 1).toFixed(1))
}
const spot: FillRequest = { ...base, method: 'monotone-convex', kind: 'spot-rate' }
curveRow('monotone-convex', 'ln P, spot annual', spot, RUNS)
curveRow('monotone-convex', 'ln P, spot contin.', { ...spot, compounding: 'continuous' }, RUNS)
const factors = knots.map(k => ({ x: k.x, y: new D(k.y).plus(1).pow(new D(k.x).neg()).toSD(12).toString() }))
curveRow('monotone-convex', 'ln P, disc. factor', { ...spot, knots: factors, kind: 'discount-factor' }, RUNS)
{
  // the method's own work: fit and the values of ln P on the grid, without mapping back to rates
  const fitted = fitRequest(spot)
  const { xs, uniform } = fitted.points
  const t = timeAgainstBaseline(() => evaluateAscending(fitRequest(spot).pp, xs, 'error', fitted.spec.workingPrecision, uniform), RUNS)
  ratioRow('monotone-convex', 'ln P values only', t, N)
}
const sw: FillRequest = { ...spot, method: 'smith-wilson', options: { ufr: '0.035', alpha: '0.1' }, extrapolation: 'method' }
curveRow('smith-wilson', 'alpha 0.1, 121 terms', sw, 3)
{
  // calibration alone on a curve of 20 annual terms (auto alpha: about 20 solves of the Wilson system)
  const twenty = { ...sw, knots: knots.filter((_, i) => i > 0 && i % 6 === 0).slice(0, 20), options: { ufr: '0.035' } }
  const t = time(() => fitRequest(twenty, null), 3)
  rows.push(['smith-wilson', 'auto alpha, 20 terms: fit', t.toFixed(1), '-', '-', '-', '-'])
}
{
  // two-way: knots every 7 in x (0..119, 18 values) and every 4 in d (0..24, 7 values), filled to 120 x 25 = 3,000 points
  const knots2: Knot2D[] = []
  for (let x = 0; x <= 119; x += 7) {
    for (let d = 0; d <= 24; d += 4) knots2.push({ x: String(x), d: String(d), y: new D('0.0004').times(new D(x).div(12).exp()).times(new D(1).minus(new D(-d).div(5).exp().times('0.4'))).toSD(8).toString() })
  }
  for (const method of ['cubic-not-a-knot', 'linear', 'pchip'] as MethodId[]) {
    const request: Fill2DRequest = { knots: knots2, method, grid: { x: { from: '0', to: '119', step: '1' }, d: { from: '0', to: '24', step: '1' } }, precision: 40 }
    const t = timeAgainstBaseline(() => fill2dCore(request), RUNS)
    ratioRow(`fill2d ${method}`, '18x7 -> 120x25', t, 3000, time(() => fill2d(request), 3).toFixed(1) + ' (all)')
  }
}

// Graduation of 100 ages (Whittaker-Henderson, order 3) from invented deaths and exposures; split of 20 five-year groups;
// old-age closure (a fill of 17 five-year ages to every age up to 120 with the law fitted above age 100).
const gradPoints = Array.from({ length: 100 }, (_, i) => {
  const q = new D('0.0004').times(new D('1.07').pow(i))
  const E = new D(20000).times(new D('0.985').pow(i)).toDecimalPlaces(2)
  return { x: String(20 + i), deaths: q.times(E).times(new D(1).plus(new D(i * 7.3).sin().times('0.1'))).round().toString(), exposure: E.toString() }
})
// small requests: a few more warm-up runs, so the JIT has compiled them as it has in a running server; timed both after a
// forced full GC (as the rows above) and without one (as in a running server: a forced full GC shrinks the young generation,
// and a request that allocates many small Decimals then pays for extra scavenges)
const graduation = () => graduate({ points: gradPoints, order: 3, smoothing: '50000000', precision: 40 })
const gradMs = time(graduation, 15, 5)
const gradWarmMs = time(graduation, 15, 5, false)
const splitGroups = Array.from({ length: 20 }, (_, k) => ({ from: String(5 * k), to: String(5 * k + 4), total: new D(1000).times(new D(1).plus(new D(k).div(3).sin().times('0.3'))).toDecimalPlaces(0).toString() }))
const splitRows = (['sprague', 'beers', 'karup-king'] as const).map(method => [method, time(() => split({ groups: splitGroups, method, precision: 40 }), 15, 5)] as const)
const closureKnots = Array.from({ length: 17 }, (_, i) => ({ x: String(20 + 5 * i), y: new D('0.0005').times(new D('1.085').pow(5 * i)).toSD(10).toString() }))
const closureRows = (['gompertz', 'kannisto'] as const).map(rule => [rule, time(() => fill({ knots: closureKnots, method: 'pchip', kind: 'mortality', extrapolation: rule, grid: { from: '20', to: '120', step: '1' }, precision: 40 }), 15, 5)] as const)

const curve: FillRequest = { ...base, kind: 'spot-rate' }
const curveCore = fillCore(curve)
const curveChecks = time(() => { computeDiagnostics(curveCore); computeMoney(curveCore) }, 3)

const cpu = cpus()
console.log(`Knotwork engine benchmark, ${new Date().toISOString()}`)
console.log(`Node ${process.version}, ${cpu.length} cores (${cpu[0]?.model ?? 'unknown CPU'}), load average at end ${loadavg().map(l => l.toFixed(2)).join(' ')}`)
console.log(`Setup: ${KNOTS} knots at x = 0, 1.2, ..., 144; grid 0..144 step 0.01 = ${N} points; precision 40 (working ${core.spec.workingPrecision}); median of ${RUNS} runs`)
console.log(`Baseline (1 sub + 3 mul + 3 add on Decimal at 40 digits, per point, ${N} points): ${baselineMs.toFixed(1)} ms = ${(baselineMs * 1000 / N).toFixed(3)} us/point at start;`)
console.log('Each row also times the baseline in alternate runs (column baseline ms); ratio = fit+eval / that baseline.')
console.log('')
const head = ['method', 'transform', 'fit+eval ms (min)', 'points/s', 'baseline ms (min)', 'ratio (min/min)', 'diagnostics+money ms']
const widths = head.map((h, j) => Math.max(h.length, ...rows.map(r => r[j]!.length)))
const line = (r: string[]) => r.map((c, j) => (j < 2 ? c.padEnd(widths[j]!) : c.padStart(widths[j]!))).join('  ')
console.log(line(head))
for (const r of rows) console.log(line(r))
console.log('')
console.log(`Curve checks (kind spot-rate: forward rates on all ${N} points, one ln each, plus money), natural cubic: ${curveChecks.toFixed(1)} ms`)
console.log(`Graduation (Whittaker-Henderson, order 3, 100 ages, deaths and exposures, with its fit tests) at 40 digits: ${gradWarmMs.toFixed(1)} ms without a forced GC, ${gradMs.toFixed(1)} ms right after one (target <= 100 ms)`)
for (const [method, ms] of splitRows) console.log(`Split of 20 five-year groups into 100 single years, ${method}, 40 digits: ${ms.toFixed(1)} ms`)
for (const [rule, ms] of closureRows) console.log(`Fill with old-age closure (${rule}), 17 five-year ages -> 101 ages to 120, pchip, with checks and money: ${ms.toFixed(1)} ms`)
console.log('Targets: natural cubic fit+eval at 40 digits <= 60 ms; ratio <= 2 (every interpolation method).')
