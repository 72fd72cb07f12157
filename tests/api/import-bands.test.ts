// A band axis on import, against the built server: the preview explains the bands and asks; the answer "totals" splits
// them into single ages (each band's total kept, checked again here exactly), "rates" keeps one point per band; commit
// makes the split draft and is refused while the question is open.
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import Decimal from 'decimal.js'
import type { ImportPreviewDto } from '#shared/types/tables'
import { Client, DEMO, LARKSPUR, closeOwnerDb, ownerDb, signedIn } from './helpers'
import { upload } from './import-helpers'

// exposures (years lived) in five-year bands of an invented study: test data, the check is that totals are kept
const BANDS = [['55 to 59', '10450.5'], ['60 to 64', '9870.25'], ['65 to 69', '8120'], ['70 to 74', '6233.75'], ['75 to 79', '4010'], ['80 to 84', '2105.5']]
let analyst: Client
let base: string
const name = `Zz exposures by band ${Math.random().toString(36).slice(2, 8)}`
const mapping = (bands?: Record<string, string>) => ({ sheet: 'bands', headerRow: 0, axisColumn: 0, axis: 'age', axisUnit: 'years', columns: [{ index: 1, name, kind: 'other', valueUnit: 'per-unit' }], ...(bands ? { bands } : {}) })

beforeAll(async () => {
  analyst = await signedIn(DEMO.analyst)
  const up = await upload(analyst, LARKSPUR, 'bands.csv', `Age band,Exposure\n${BANDS.map(b => b.join(',')).join('\n')}\n`)
  expect(up.status).toBe(201)
  base = `/api/orgs/${LARKSPUR}/imports/${up.body.id}`
})
afterAll(closeOwnerDb)

describe('band axis on import', () => {
  it('suggests the band column as the axis, explains the bands and asks (blocking) before anything is split', async () => {
    const described = await analyst.get<{ columns: { role: string }[] }>(base)
    expect(described.body.columns.map(c => c.role)).toEqual(['axis', 'value'])
    const r = await analyst.post<ImportPreviewDto>(`${base}/preview`, mapping())
    expect(r.status).toBe(200)
    expect(r.body.bands).toMatchObject({ count: 6, first: '55–59', last: '80–84', widths: [5], answer: null })
    expect(r.body.findings.map(f => f.code)).toEqual(['bands-unanswered'])
    const commit = await analyst.post<{ data: { code: string } }>(`${base}/commit`, { mapping: mapping() })
    expect(commit.status).toBe(422)
    expect(commit.body.data.code).toBe('import-blocked')
  })

  it('keeps rates for a band as one point at its middle', async () => {
    const r = await analyst.post<ImportPreviewDto>(`${base}/preview`, mapping({ values: 'rates' }))
    expect(r.body.errors).toBe(0)
    expect(r.body.tables[0]!.pointCount).toBe(6)
    expect(r.body.tables[0]!.sample[0]).toEqual({ x: '57.5', y: '10450.5' })
  })

  it('splits totals into single ages with Beers, each band\u2019s total kept, and commits that draft', async () => {
    const m = mapping({ values: 'totals', split: 'beers' })
    const r = await analyst.post<ImportPreviewDto>(`${base}/preview`, m)
    expect(r.body.errors).toBe(0)
    expect(r.body.tables[0]!.pointCount).toBe(30)
    expect(r.body.bands!.checks.map(c => [c.band, c.total, c.kept])).toEqual(BANDS.map(([b, t]) => [b!.replace(' to ', '–'), t, true]))
    const done = await analyst.post<{ tables: { versionId: string }[] }>(`${base}/commit`, { mapping: m })
    expect(done.status).toBe(201)
    const [rows] = await ownerDb().query('SELECT x::text AS x, y::text AS y FROM version_points WHERE version_id = :id ORDER BY x', { replacements: { id: done.body.tables[0]!.versionId } })
    const points = rows as { x: string, y: string }[]
    expect(points.map(p => Number(p.x))).toEqual(Array.from({ length: 30 }, (_, i) => 55 + i))
    for (const [band, total] of BANDS) {
      const from = Number(band!.slice(0, 2))
      const sum = points.filter(p => Number(p.x) >= from && Number(p.x) < from + 5).reduce((s, p) => s.plus(p.y), new Decimal(0))
      expect(sum.eq(total!), band).toBe(true)
    }
  })
})
