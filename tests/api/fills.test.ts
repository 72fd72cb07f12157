// The fill bench routes against the built server: compare is the engine's own answer, a saved fill is exactly the engine's
// values (NUMERIC), stale drafts get 409, and a saved spec re-runs digit for digit.
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import Decimal from 'decimal.js'
import { compare, fill } from '~~/server/engine/index'
import type { CompareResult, FillRequest, ResolvedSpec } from '~~/server/engine/types'
import { Client, DEMO, LARKSPUR, FENWICK, closeOwnerDb, ownerDb, signedIn } from './helpers'
import { lookupIds } from './route-matrix/ids'

type Point = { x: string, y: string }
const GRID = { from: '55', to: '110', step: '1' }
const METHODS = [{ method: 'linear' as const }, { method: 'quadratic' as const, options: { condition: 'right-zero-curvature' } }, { method: 'cubic-natural' as const }]
let actuary: Client
let base: string
let versionId: string

/** NUMERIC text and engine text compared as canonical decimals (no trailing zeros, no exponent). */
const canon = (v: string) => new Decimal(v).toFixed()

async function storedPoints(table: 'version_points' | 'version_fill_points'): Promise<Point[]> {
  const [rows] = await ownerDb().query(`SELECT p.x::text AS x, p.y::text AS y FROM ${table} p WHERE p.version_id = :versionId ORDER BY p.x`, { replacements: { versionId } })
  return rows as Point[]
}
async function lockVersion(): Promise<number> {
  const [rows] = await ownerDb().query('SELECT lock_version FROM table_versions WHERE id = :versionId', { replacements: { versionId } })
  return (rows as { lock_version: number }[])[0]!.lock_version
}

beforeAll(async () => {
  const ids = await lookupIds(LARKSPUR)
  base = `/api/orgs/${LARKSPUR}/tables/${ids.benchTable}/versions/${ids.benchNumber}`
  const [rows] = await ownerDb().query('SELECT id FROM table_versions WHERE table_id = :t AND number = :n', { replacements: { t: ids.benchTable, n: Number(ids.benchNumber) } })
  versionId = (rows as { id: string }[])[0]!.id
  actuary = await signedIn(DEMO.actuary)
})
afterAll(closeOwnerDb)

describe('compare', () => {
  it('answers exactly what the engine answers for the stored points', async () => {
    const r = await actuary.post<{ result: CompareResult }>(`${base}/compare`, { grid: GRID, methods: METHODS })
    expect(r.status).toBe(200)
    const knots = await storedPoints('version_points')
    const request: FillRequest = { knots, kind: 'mortality', method: 'linear', transform: 'none', extrapolation: 'error', grid: GRID }
    const direct = compare(request, METHODS.map(m => ({ method: m.method, options: m.options ?? {}, transform: 'none' })))
    expect(r.body.result).toEqual(direct)
    // the right-end quadratic zig-zags on these points, the natural cubic does not (the bench must show it)
    const zig = r.body.result.entries.map(e => (e.ok ? e.result.diagnostics.curvatureSignChanges.count : -1))
    expect(zig[1]).toBeGreaterThan(0)
    expect(zig[2]).toBe(0)
  })

  it('lets an analyst compare, refuses an auditor (403) and another organisation (404)', async () => {
    const body = { grid: GRID, methods: METHODS }
    expect((await (await signedIn(DEMO.analyst)).post(`${base}/compare`, body)).status).toBe(200)
    expect((await (await signedIn(DEMO.auditor)).post(`${base}/compare`, body)).status).toBe(403)
    // an analyst of Fenwick & Rowe only: Larkspur is not theirs, and Larkspur's table is not in Fenwick & Rowe
    const other = await signedIn('ravi.desai@fenwickrowe.example')
    expect((await other.post(`${base}/compare`, body)).status).toBe(404)
    expect((await other.post(base.replace(LARKSPUR, FENWICK) + '/compare', body)).status).toBe(404)
  })

  it('reports how many methods are filled while it runs, to the person who started it only', async () => {
    const runId = `run-${Date.now()}`
    const progressUrl = `/api/orgs/${LARKSPUR}/compare-progress/${runId}`
    const seen: { done: number, total: number }[] = []
    const running = actuary.post(`${base}/compare`, { grid: { from: '55', to: '110', step: '0.01' }, methods: [...METHODS, { method: 'pchip' as const }], runId })
    for (let i = 0; i < 40 && seen.at(-1)?.done !== 4; i++) {
      const p = await actuary.get<{ done: number, total: number }>(progressUrl)
      if (p.status === 200) seen.push(p.body)
      await new Promise(r => setTimeout(r, 50))
    }
    expect((await running).status).toBe(200)
    expect(seen.every(p => p.total === 4 && p.done >= 0 && p.done <= 4)).toBe(true)
    expect((await actuary.get(progressUrl)).body).toEqual({ done: 4, total: 4, status: 'done' })
    expect((await (await signedIn(DEMO.analyst)).get(progressUrl)).status).toBe(404)
  })

  it('refuses a body that fails the shared schema', async () => {
    const r = await actuary.post<{ statusMessage: string }>(`${base}/compare`, { grid: { from: '55', to: '110', step: '0' }, methods: METHODS })
    expect(r.status).toBe(400)
  })
})

describe('saving a fill', () => {
  const rationale = 'Natural cubic: passes through every point, bends one way, no zig-zag.'
  let saved: { spec: ResolvedSpec & { bench: unknown }, lockVersion: number }

  it('stores exactly the engine values, with an audit event in the same change', async () => {
    const lock = await lockVersion()
    const [before] = await ownerDb().query("SELECT count(*)::int AS n FROM audit_events WHERE action = 'version.fill.save' AND object_id = :versionId", { replacements: { versionId } })
    const r = await actuary.post<typeof saved>(`${base}/fill`, { grid: GRID, choice: { method: 'cubic-natural' }, rationale, lockVersion: lock })
    expect(r.status).toBe(200)
    saved = r.body
    expect(saved.lockVersion).toBe(lock + 1)
    const expected = fill({ knots: await storedPoints('version_points'), kind: 'mortality', method: 'cubic-natural', options: {}, transform: 'none', extrapolation: 'error', grid: GRID })
    const stored = await storedPoints('version_fill_points')
    expect(stored.length).toBe(56)
    expect(stored.map(p => [canon(p.x), canon(p.y)])).toEqual(expected.points.map(p => [canon(p.x), canon(p.y)]))
    const [after] = await ownerDb().query("SELECT count(*)::int AS n FROM audit_events WHERE action = 'version.fill.save' AND object_id = :versionId", { replacements: { versionId } })
    expect((after as { n: number }[])[0]!.n).toBe((before as { n: number }[])[0]!.n + 1)
    const [row] = await ownerDb().query('SELECT fill_rationale, filled_at FROM table_versions WHERE id = :versionId', { replacements: { versionId } })
    expect((row as { fill_rationale: string }[])[0]!.fill_rationale).toBe(rationale)
  })

  it('re-running the saved spec on the stored points reproduces the values digit for digit', async () => {
    const [row] = await ownerDb().query('SELECT fill_spec FROM table_versions WHERE id = :versionId', { replacements: { versionId } })
    const spec = (row as { fill_spec: ResolvedSpec }[])[0]!.fill_spec
    const again = fill({ knots: await storedPoints('version_points'), kind: spec.kind, method: spec.method, options: spec.options, transform: spec.transform, extrapolation: spec.extrapolation, ...(spec.grid ? { grid: spec.grid } : { at: spec.at! }), precision: spec.precision, money: spec.money })
    const stored = await storedPoints('version_fill_points')
    expect(again.points.map(p => canon(p.y))).toEqual(stored.map(p => canon(p.y)))
    expect(again.spec.engineVersion).toBe(spec.engineVersion)
  })

  it('gets 409 with a stale lock and changes nothing', async () => {
    const before = await storedPoints('version_fill_points')
    const r = await actuary.post(`${base}/fill`, { grid: GRID, choice: { method: 'linear' }, rationale: 'Linear, to see whether a stale save is refused.', lockVersion: saved.lockVersion - 1 })
    expect(r.status).toBe(409)
    expect(await storedPoints('version_fill_points')).toEqual(before)
    expect(await lockVersion()).toBe(saved.lockVersion)
  })

  it('needs a rationale of at least 20 characters', async () => {
    const r = await actuary.post(`${base}/fill`, { grid: GRID, choice: { method: 'linear' }, rationale: 'too short', lockVersion: saved.lockVersion })
    expect(r.status).toBe(400)
  })

  it('shows the saved fill to every member, refuses a fill from an auditor and on a signed-off version', async () => {
    const auditor = await signedIn(DEMO.auditor)
    const g = await auditor.get<{ fill: { rationale: string, filledBy: { name: string }, stale: boolean } }>(`${base}/fill`)
    expect(g.status).toBe(200)
    expect(g.body.fill.rationale).toBe(rationale)
    expect(g.body.fill.stale).toBe(false)
    expect((await auditor.post(`${base}/fill`, { grid: GRID, choice: { method: 'linear' }, rationale, lockVersion: saved.lockVersion })).status).toBe(403)
    const signedOff = base.replace(/\/versions\/\d+$/, '/versions/1')
    expect((await actuary.post(`${signedOff}/fill`, { grid: GRID, choice: { method: 'linear' }, rationale, lockVersion: 0 })).status).toBe(409)
    expect((await actuary.post(`${signedOff}/compare`, { grid: GRID, methods: METHODS })).status).toBe(200)
  })
})
