/**
 * Fill-bench comparison benchmark (npm run bench:compare). Prints figures; asserts nothing.
 * Server time: the compare route's own work after loading the points (server/services/fill-request.ts buildFillRequest for
 * each method, then the engine's compare with diagnostics and money), timed in-process; medians over several runs.
 *   (a) mortality, 17 knots (ages 20..100 step 5, invented Makeham q_x) to 81 ages (step 1)
 *   (b) spot-rate curve, 11 standard tenors (invented Svensson) to 358 monthly terms (0.25..30 step 1/12)
 *   (c) 121 knots (x = 0, 1.2, ..., 144) to 14,401 points (step 0.01), kind 'other' (no money view), as bench:engine
 * Click to chart: with KW_BASE_URL set, headless Chromium signs in, opens the bench of the demo discount curve (b),
 * chooses 6 methods, and times the click on Compare until the values chart reports 'finished' for that run.
 */
import { performance } from 'node:perf_hooks'
import { compare } from '../server/engine/index'
import type { MethodSpec } from '../server/engine/types'
import { buildFillRequest } from '../server/services/fill-request'
import type { CompareInput } from '../shared/schemas/fills'
import { makehamQx, svenssonSpot } from '../scripts/seed/tables'

const SIX: CompareInput['methods'] = [
  { method: 'linear' }, { method: 'quadratic' }, { method: 'cubic-natural' }, { method: 'cubic-not-a-knot' }, { method: 'pchip' }, { method: 'akima' },
]
const median = (v: number[]) => [...v].sort((a, b) => a - b)[Math.floor(v.length / 2)]!

function serverTime(name: string, knots: { x: string, y: string }[], kind: 'mortality' | 'spot-rate' | 'other', grid: CompareInput['grid'], runs: number) {
  const input: Omit<CompareInput, 'methods' | 'baseline'> = { grid, transform: 'none', extrapolation: 'error' }
  const times: number[] = []
  let points = 0
  for (let r = 0; r < runs + 2; r += 1) {
    const started = performance.now()
    const requests = SIX.map(m => buildFillRequest({ knots, kind }, input, m))
    const result = compare(requests[0]!, SIX.map((m, i): MethodSpec => ({ method: m.method, options: {}, transform: requests[i]!.transform })))
    const ms = performance.now() - started
    if (r >= 2) times.push(ms) // two warm-up runs
    const first = result.entries[0]!
    points = first.ok ? first.result.points.length : 0
    if (result.entries.some(e => !e.ok)) throw new Error(`${name}: a method failed: ${JSON.stringify(result.entries.find(e => !e.ok))}`)
  }
  console.log(`${name.padEnd(44)} ${String(knots.length).padStart(4)} knots -> ${String(points).padStart(6)} points   median ${median(times).toFixed(1).padStart(8)} ms   (min ${Math.min(...times).toFixed(1)}, max ${Math.max(...times).toFixed(1)}, ${runs} runs)`)
}

async function clickToChart(base: string) {
  const { chromium } = await import('playwright-core')
  const browser = await chromium.launch({ executablePath: process.env.KW_CHROMIUM ?? '/usr/bin/chromium', args: ['--no-sandbox', '--disable-gpu', '--disable-dev-shm-usage', '--disable-background-networking', '--disable-component-update', '--disable-sync', '--no-first-run', '--disable-quic'] })
  const page = await browser.newPage({ baseURL: base, viewport: { width: 1366, height: 860 } })
  await page.setExtraHTTPHeaders({ 'x-forwarded-for': '10.250.0.1' })
  await page.goto('/signin')
  await page.getByLabel('E-mail').fill('tomas.varga@larkspur.example')
  await page.getByLabel('Password').fill('knotwork-demo-2026')
  await page.getByRole('button', { name: 'Sign in' }).click()
  await page.waitForURL(/\/orgs\//)
  const tables = await (await page.request.get('/api/orgs/larkspur-mutual/tables')).json() as { id: string, name: string }[]
  const curve = tables.find(t => t.name === 'Discount curve 2026-09-30')!
  await page.goto(`/orgs/larkspur-mutual/tables/${curve.id}/versions/1/bench`)
  const settled = () => page.waitForFunction(() => {
    const root = document.querySelector<HTMLElement>('[data-drawn-run]')
    return !!root && root.dataset.run !== '0' && root.dataset.drawnRun === root.dataset.run
  }, undefined, { polling: 'raf', timeout: 60_000 })
  await settled()
  for (const label of ['Not-a-knot cubic spline', 'Monotone cubic (PCHIP)', 'Akima']) {
    await page.locator('#bench-add').selectOption({ label })
    await page.getByRole('button', { name: 'Add', exact: true }).click()
  }
  const times: number[] = []
  for (let r = 0; r < 7; r += 1) {
    const before = await page.evaluate(() => Number(document.querySelector<HTMLElement>('[data-drawn-run]')?.dataset.run ?? 0))
    const started = performance.now()
    await page.getByTestId('bench-compare').click()
    // the next run, drawn (waiting for "not yet drawn" first could miss a run that finishes within one frame)
    await page.waitForFunction((prev) => {
      const root = document.querySelector<HTMLElement>('[data-drawn-run]')
      return !!root && Number(root.dataset.run) > prev && root.dataset.drawnRun === root.dataset.run
    }, before, { polling: 'raf', timeout: 60_000 })
    if (r >= 1) times.push(performance.now() - started)
  }
  const methods = await page.locator('[data-testid=bench-methods] li').count()
  console.log(`${'click Compare to chart drawn, (b) in Chromium'.padEnd(44)} ${methods} methods, 358 points   median ${median(times).toFixed(0).padStart(8)} ms   (min ${Math.min(...times).toFixed(0)}, max ${Math.max(...times).toFixed(0)}, ${times.length} runs)`)
  await browser.close()
}

const ages = Array.from({ length: 17 }, (_, i) => 20 + 5 * i)
const tenors = ['0.25', '0.5', '1', '2', '3', '5', '7', '10', '15', '20', '30']
const wide = Array.from({ length: 121 }, (_, i) => {
  const x = (i * 12) / 10
  return { x: String(x), y: (0.02 + 0.01 * Math.sin(x / 17) + x / 10_000).toFixed(8) }
})
console.log(`Compare benchmark: 6 methods (${SIX.map(m => m.method).join(', ')}), 40 significant digits; Node ${process.version}`)
serverTime('(a) mortality, ages 20..100 step 5 -> 20..100', makehamQx('0.0004', '0.000035', '1.098', ages, 0, 0), 'mortality', { from: '20', to: '100', step: '1' }, 21)
serverTime('(b) curve, 11 tenors -> monthly 0.25..30', svenssonSpot(0.032, -0.012, 0.018, -0.01, 1.8, 9, tenors), 'spot-rate', { from: '0.25', to: '30', step: '1/12' }, 21)
serverTime('(c) 121 knots -> 14,401 points', wide, 'other', { from: '0', to: '144', step: '0.01' }, 5)
if (process.env.KW_BASE_URL) await clickToChart(process.env.KW_BASE_URL)
else console.log('click to chart: skipped (set KW_BASE_URL to a running server)')
