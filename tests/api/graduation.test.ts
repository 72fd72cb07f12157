// The graduate step against the built server: the preview is exactly the engine's graduation of the stored points, nothing
// is stored until "make this a new draft" (with reasons), which recomputes the graduation, records how it was made, withdraws
// the crude draft as superseded, and writes the audit in the same transaction. Roles, organisations, kinds and stale
// drafts are refused.
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { graduate } from '~~/server/engine/index'
import type { GraduateResult } from '~~/server/engine/types'
import { Client, DEMO, LARKSPUR, closeOwnerDb, count, ownerDb, signedIn } from './helpers'
import { upload } from './import-helpers'
import { lookupIds } from './route-matrix/ids'
import { canonicalDecimal } from '#shared/decimal-text'

type Point = { x: string, y: string }
const tag = () => Math.random().toString(36).slice(2, 8)
let actuary: Client
let tableId: string
let base: string
// named to sort last: the route matrix takes the first table (by name) with a draft as its example (route-matrix/ids.ts)

// Crude rates: the Standard Ultimate Life Table's Makeham law (A = 0.00022, B = 2.7e-6, c = 1.124; Dickson, Hardy and
// Waters, AMLCR; from memory) at ages 60..89, with a fixed pattern of +-4 % scatter standing in for sampling noise.
const SCATTER = [0.04, -0.03, 0.01, -0.04, 0.02, 0.03, -0.02, -0.01, 0.04, -0.03]
const crude = Array.from({ length: 30 }, (_, i) => {
  const x = 60 + i
  const mu = (t: number) => 0.00022 + 2.7e-6 * 1.124 ** t
  const q = 1 - Math.exp(-(mu(x) + mu(x + 1)) / 2)
  return { x: String(x), y: canonicalDecimal((q * (1 + SCATTER[i % 10]!)).toPrecision(6)) }
})

async function stored(versionNumber: number): Promise<{ id: string, status: string, graduation: Record<string, unknown> | null, points: Point[] }> {
  const [rows] = await ownerDb().query('SELECT id, status, graduation FROM table_versions WHERE table_id = :tableId AND number = :n', { replacements: { tableId, n: versionNumber } })
  const v = (rows as { id: string, status: string, graduation: Record<string, unknown> | null }[])[0]!
  const [pts] = await ownerDb().query('SELECT x::text AS x, y::text AS y FROM version_points WHERE version_id = :id ORDER BY x', { replacements: { id: v.id } })
  return { ...v, points: pts as Point[] }
}

beforeAll(async () => {
  actuary = await signedIn(DEMO.actuary)
  const csv = `age,q\n${crude.map(p => `${p.x},${p.y}`).join('\n')}\n`
  const up = await upload(actuary, LARKSPUR, 'crude.csv', csv)
  expect(up.status).toBe(201)
  const mapping = { sheet: 'crude', headerRow: 0, axisColumn: 0, axis: 'age', axisUnit: 'years', columns: [{ index: 1, name: `Zz crude mortality, graduation test ${tag()}`, kind: 'mortality', valueUnit: 'per-unit' }] }
  const done = await actuary.post<{ tables: { id: string }[] }>(`/api/orgs/${LARKSPUR}/imports/${up.body.id}/commit`, { mapping })
  expect(done.status).toBe(201)
  tableId = done.body.tables[0]!.id
  base = `/api/orgs/${LARKSPUR}/tables/${tableId}/versions`
})
afterAll(closeOwnerDb)

describe('graduate: the preview', () => {
  it('is the engine\u2019s graduation of the stored points, with the fit tests, and stores nothing', async () => {
    const versionsBefore = await count('SELECT 1 FROM table_versions WHERE table_id = :tableId', { tableId })
    const r = await actuary.post<{ result: GraduateResult, crude: Point[], withExposures: boolean, lockVersion: number }>(`${base}/1/graduate`, { order: 3, smoothing: '1000', digits: 10 })
    expect(r.status).toBe(200)
    const direct = graduate({ points: (await stored(1)).points.map(p => ({ x: p.x, y: p.y })), order: 3, smoothing: '1000', precision: 10 })
    expect(r.body.result).toEqual(direct)
    expect(r.body.crude).toEqual(crude)
    expect(r.body.withExposures).toBe(false)
    expect(r.body.result.diagnostics.chiSquare).toBeNull()
    // smoother than the crude rates by the measure the smoothing penalises
    expect(Number(r.body.result.diagnostics.smoothness.graduated)).toBeLessThan(Number(r.body.result.diagnostics.smoothness.crude))
    expect(await count('SELECT 1 FROM table_versions WHERE table_id = :tableId', { tableId })).toBe(versionsBefore)
  })

  it('refuses a bad order or smoothing (400 with the field), an auditor (403), another organisation (404) and a curve (400)', async () => {
    const bad = await actuary.post<{ data: { code: string } }>(`${base}/1/graduate`, { order: 9, smoothing: '-1' })
    expect(bad.status).toBe(400)
    expect(bad.body.data.code).toBe('invalid-input')
    expect((await (await signedIn(DEMO.auditor)).post(`${base}/1/graduate`, { smoothing: '10' })).status).toBe(403)
    expect((await (await signedIn('ravi.desai@fenwickrowe.example')).post(`${base}/1/graduate`, { smoothing: '10' })).status).toBe(404)
    const [rows] = await ownerDb().query(`SELECT t.id FROM rate_tables t JOIN organisations o ON o.id = t.org_id WHERE o.slug = :slug AND t.kind = 'spot-rate' LIMIT 1`, { replacements: { slug: LARKSPUR } })
    const curve = (rows as { id: string }[])[0]!.id
    const refused = await actuary.post<{ data: { code: string } }>(`/api/orgs/${LARKSPUR}/tables/${curve}/versions/1/graduate`, { smoothing: '10' })
    expect(refused.status).toBe(400)
    expect(refused.body.data.code).toBe('not-graduated-kind')
  })
})

describe('graduate: make this a new draft', () => {
  it('refuses a stale lock version (409) and too short reasons (400), changing nothing', async () => {
    const stale = await actuary.post<{ data: { code: string } }>(`${base}/1/graduated-draft`, { order: 3, smoothing: '1000', rationale: 'Smooth enough and the tests pass well.', lockVersion: 99 })
    expect(stale.status).toBe(409)
    expect(stale.body.data.code).toBe('draft-conflict')
    expect((await actuary.post(`${base}/1/graduated-draft`, { order: 3, smoothing: '1000', rationale: 'short', lockVersion: 0 })).status).toBe(400)
    expect((await stored(1)).status).toBe('draft')
  })

  it('makes version 2 from the graduation, records how, withdraws the crude draft as superseded, audits both', async () => {
    const lock = (await actuary.get<{ lockVersion: number }>(`${base}/1`)).body.lockVersion
    const rationale = 'Order 3 with smoothing 1000: signs and runs look fine, third differences far below the crude ones.'
    const r = await actuary.post<{ number: number, status: string, notes: string, graduation: { fromNumber: number, rationale: string, byName: string, spec: { order: number, smoothing: string } } }>(`${base}/1/graduated-draft`, { order: 3, smoothing: '1000', digits: 10, rationale, lockVersion: lock })
    expect(r.status).toBe(201)
    expect(r.body).toMatchObject({ number: 2, status: 'draft', notes: 'Graduated from version 1 (Whittaker-Henderson, order 3, smoothing 1000).' })
    expect(r.body.graduation).toMatchObject({ fromNumber: 1, rationale, byName: 'Tomas Varga', spec: { order: 3, smoothing: '1000' } })
    const direct = graduate({ points: crude, order: 3, smoothing: '1000', precision: 10 })
    const v2 = await stored(2)
    expect(v2.points.map(p => ({ x: p.x, y: String(Number(p.y)) }))).toEqual(direct.points.map(p => ({ x: p.x, y: String(Number(p.y)) })))
    expect(v2.points.every((p, i) => p.y.replace(/0+$/, '') === direct.points[i]!.y.replace(/0+$/, ''))).toBe(true)
    const v1 = await stored(1)
    expect(v1.status).toBe('retired')
    expect(v1.points).toHaveLength(30) // the crude values are kept
    expect(await count(`SELECT 1 FROM audit_events WHERE action = 'version.graduate' AND object_id = :id AND detail->>'rationale' = :rationale`, { id: v2.id, rationale })).toBe(1)
    expect(await count(`SELECT 1 FROM audit_events WHERE action = 'version.retire' AND object_id = :id AND (detail->>'supersededBy')::int = 2`, { id: v1.id })).toBe(1)
    // the new draft is open now: graduating the withdrawn crude version again is refused until it is finished
    const again = await actuary.post<{ data: { code: string } }>(`${base}/1/graduated-draft`, { order: 3, smoothing: '1000', rationale, lockVersion: lock + 1 })
    expect(again.status).toBe(409)
    expect(again.body.data.code).toBe('version-open')
  })
})

describe('the bench\u2019s old-age closure', () => {
  it('passes the closure options to the engine and answers its closure report', async () => {
    const ids = await lookupIds(LARKSPUR)
    const bench = `/api/orgs/${LARKSPUR}/tables/${ids.benchTable}/versions/${ids.benchNumber}`
    const body = { grid: { from: '55', to: '120', step: '1' }, extrapolation: 'gompertz', extrapolationOptions: { terminalAge: '115', fitFrom: '90' }, methods: [{ method: 'pchip' }] }
    const r = await actuary.post<{ result: { entries: { ok: boolean, result: { spec: { extrapolationOptions: Record<string, string> }, diagnostics: { closure: { law: string, fitFrom: string, terminalAge: string } }, points: Point[] } }[] } }>(`${bench}/compare`, body)
    expect(r.status).toBe(200)
    const entry = r.body.result.entries[0]!
    expect(entry.ok).toBe(true)
    expect(entry.result.diagnostics.closure).toMatchObject({ law: 'gompertz', fitFrom: '90', terminalAge: '115' })
    expect(entry.result.points.find(p => p.x === '115')!.y).toBe('1')
    const unknown = await actuary.post<{ data: { code: string } }>(`${bench}/compare`, { ...body, extrapolationOptions: { lastAge: '115' } })
    expect(unknown.status).toBe(400)
  })
})

describe('graduate: weights and fit tests from imported exposures and deaths', () => {
  // experience invented for the test: exposures falling with age, deaths the Makeham rates above times the exposure,
  // rounded to whole deaths; the crude rate is deaths / exposure
  const experience = crude.map((p, i) => {
    const exposure = 4000 - 110 * i
    const deaths = Math.round(Number(p.y) * exposure)
    return { x: p.x, exposure: String(exposure), deaths: String(deaths), y: canonicalDecimal((deaths / exposure).toPrecision(8)) }
  })
  const csv = `age,central exposure,deaths,crude q\n${experience.map(e => `${e.x},${e.exposure},${e.deaths},${e.y}`).join('\n')}\n`
  const mapping = (name: string, extra: Record<string, unknown> = {}) => ({ sheet: 'crude', headerRow: 0, axisColumn: 0, axis: 'age', axisUnit: 'years', columns: [{ index: 3, name, kind: 'mortality', valueUnit: 'per-unit' }], experience: { exposureColumn: 1, deathsColumn: 2 }, ...extra })

  it('are suggested by their headings, read at preview, kept with the table, and weight the graduation (the engine\u2019s answer with them, chi-square included)', async () => {
    const up = await upload(actuary, LARKSPUR, 'crude.csv', csv)
    expect(up.status).toBe(201)
    const described = await actuary.get<{ columns: { index: number, role: string }[] }>(`/api/orgs/${LARKSPUR}/imports/${up.body.id}`)
    expect(described.body.columns.map(c => c.role)).toEqual(['axis', 'exposure', 'deaths', 'value'])
    const name = `Zz crude with experience ${tag()}`
    const preview = await actuary.post<{ experience: { exposures: number, deaths: number }, errors: number }>(`/api/orgs/${LARKSPUR}/imports/${up.body.id}/preview`, mapping(name))
    expect(preview.status).toBe(200)
    expect(preview.body).toMatchObject({ errors: 0, experience: { exposures: 30, deaths: 30 } })
    const done = await actuary.post<{ tables: { id: string }[] }>(`/api/orgs/${LARKSPUR}/imports/${up.body.id}/commit`, { mapping: mapping(name) })
    expect(done.status).toBe(201)
    const id = done.body.tables[0]!.id
    expect(await count('SELECT 1 FROM table_experience WHERE table_id = :id AND deaths IS NOT NULL', { id })).toBe(30)
    for (const exposureType of ['central', 'initial'] as const) {
      const r = await actuary.post<{ result: GraduateResult, withExposures: boolean, withDeaths: boolean }>(`/api/orgs/${LARKSPUR}/tables/${id}/versions/1/graduate`, { order: 2, smoothing: '50', digits: 12, exposureType })
      expect(r.status).toBe(200)
      expect(r.body).toMatchObject({ withExposures: true, withDeaths: true })
      const direct = graduate({ points: experience.map(e => ({ x: e.x, y: e.y, exposure: e.exposure, deaths: e.deaths })), order: 2, smoothing: '50', precision: 12, exposureType })
      expect(r.body.result).toEqual(direct)
      expect(r.body.result.spec.weights).toBe('exposure')
      expect(r.body.result.diagnostics.chiSquare).not.toBeNull()
    }
  })

  it('refuses an exposure that is not a positive number (naming the cell), deaths without an exposure column, and a column used twice', async () => {
    const bad = csv.replace(`\n60,4000,`, '\n60,-4000,')
    const up = await upload(actuary, LARKSPUR, 'crude.csv', bad)
    const preview = await actuary.post<{ findings: { code: string, cell: string | null }[], errors: number }>(`/api/orgs/${LARKSPUR}/imports/${up.body.id}/preview`, mapping(`Zz bad exposure ${tag()}`))
    expect(preview.status).toBe(200)
    expect(preview.body.findings.filter(f => f.code === 'experience-invalid').map(f => f.cell)).toEqual(['B2'])
    const noExposure = await actuary.post<{ data: { code: string } }>(`/api/orgs/${LARKSPUR}/imports/${up.body.id}/preview`, mapping('Zz x', { experience: { deathsColumn: 2 } }))
    expect(noExposure.status).toBe(400)
    const twice = await actuary.post(`/api/orgs/${LARKSPUR}/imports/${up.body.id}/preview`, mapping('Zz x', { experience: { exposureColumn: 3, deathsColumn: 2 } }))
    expect(twice.status).toBe(400)
  })
})
