import { createHash } from 'node:crypto'
import { afterAll, describe, expect, it } from 'vitest'
import { makeDemoWorkbook } from '../../scripts/make-demo-workbook'
import { Client, DEMO, FENWICK, LARKSPUR, closeOwnerDb, count, signedIn } from './helpers'
import { footprint, upload, workbook } from './import-helpers'

afterAll(closeOwnerDb)
const tag = () => Math.random().toString(36).slice(2, 8)
type Finding = { severity: string; code: string; cell: string | null; message: string }
type Preview = { findings: Finding[]; errors: number; warnings: number; tables: { name: string; pointCount: number; sample: { x: string; y: string }[] }[] }

function mapping(names: string[], extra: Record<string, unknown> = {}) {
  return { sheet: 'Study 2026', headerRow: 4, axisColumn: 0, axis: 'age', axisUnit: 'years', columns: names.map((name, i) => ({ index: i + 1, name, kind: 'mortality', valueUnit: 'percent' })), ...extra }
}
async function csvImport(client: Client, csv: string) {
  const r = await upload(client, LARKSPUR, 'rules.csv', csv)
  expect(r.status).toBe(201)
  return `/api/orgs/${LARKSPUR}/imports/${r.body.id}`
}
const csvMapping = (columns: { index: number; kind: string; valueUnit: string }[], extra: Record<string, unknown> = {}) =>
  ({ sheet: 'rules', headerRow: 0, axisColumn: 0, axis: 'age', axisUnit: 'years', columns: columns.map(c => ({ ...c, name: `Rule ${c.index} ${tag()}` })), ...extra })

describe('the demo workbook, step by step', () => {
  it('proposes the header under the notes rows, detects percent, flags C17, and creates exact drafts once fixed', async () => {
    const client = await signedIn(DEMO.analyst)
    const { xlsx } = await makeDemoWorkbook()
    const up = await upload(client, LARKSPUR, 'larkspur-pensioner-study-2026.xlsx', xlsx)
    expect(up.status, JSON.stringify(up.body)).toBe(201)
    expect(up.body.sheets.map(s => s.name)).toEqual(['Study 2026', 'Read me'])
    const base = `/api/orgs/${LARKSPUR}/imports/${up.body.id}`
    const info = await client.get<{ sheet: { headerGuess: number }; columns: { role: string; valueUnit: string; unitReason: string | null; kind: string }[] }>(`${base}?sheet=Study%202026`)
    expect(info.body.sheet.headerGuess).toBe(4)
    expect(info.body.columns.map(c => c.role)).toEqual(['axis', 'value', 'value', 'ignore'])
    expect(info.body.columns[1]).toMatchObject({ kind: 'mortality', valueUnit: 'percent', unitReason: 'the header says percent' })

    const names = [`Male ${tag()}`, `Female ${tag()}`]
    const preview = await client.post<Preview>(`${base}/preview`, mapping(names))
    expect(preview.status).toBe(200)
    expect(preview.body.findings).toEqual([expect.objectContaining({ severity: 'error', cell: 'C17', message: "Sheet 'Study 2026' C17: 'n/a' is not a number" })])

    const before = await footprint()
    const blocked = await client.post<{ statusMessage: string }>(`${base}/commit`, { mapping: mapping(names) })
    expect(blocked.status).toBe(422)
    expect(await footprint()).toEqual(before)

    const fixed = mapping(names, { edits: { '16:2': '58.12%' } })
    expect((await client.post<Preview>(`${base}/preview`, fixed)).body.errors).toBe(0)
    const done = await client.post<{ tables: { id: string; versionId: string }[] }>(`${base}/commit`, { mapping: fixed })
    expect(done.status).toBe(201)
    expect(done.body.tables).toHaveLength(2)
    expect(await footprint()).toEqual({ imports: before.imports - 1, tables: before.tables + 2, versions: before.versions + 2 })

    // 0.6879 % is stored as 0.006879 exactly; the fixed cell as 0.5812
    const male = await client.get<{ points: { x: string; y: string }[]; status: string; contentHash: string }>(`/api/orgs/${LARKSPUR}/tables/${done.body.tables[0]!.id}/versions/1`)
    expect(male.body.status).toBe('draft')
    expect(male.body.points[0]).toEqual({ x: '55', y: '0.006879' })
    const female = await client.get<{ points: { x: string; y: string }[]; contentHash: string }>(`/api/orgs/${LARKSPUR}/tables/${done.body.tables[1]!.id}/versions/1`)
    expect(female.body.points.at(-1)).toEqual({ x: '110', y: '0.5812' })
    // content hash: SHA-256 of sorted "x\ty\n" lines in canonical decimal text (DEVELOPERS.md)
    const expected = createHash('sha256').update(female.body.points.map(p => `${p.x}\t${p.y}\n`).join('')).digest('hex')
    expect(female.body.contentHash).toBe(expected)
    expect(await count(`SELECT 1 FROM audit_events WHERE action IN ('table.create', 'version.create', 'import.commit') AND (object_id = :id OR detail->>'tableId' = :id OR object_id = :imp)`, { id: done.body.tables[0]!.id, imp: up.body.id })).toBe(3)
    expect((await client.get(base)).status).toBe(404) // the upload is gone once used
  })

  it('reads the CSV twin to the same finding', async () => {
    const client = await signedIn(DEMO.analyst)
    const { csv } = await makeDemoWorkbook()
    const up = await upload(client, LARKSPUR, 'larkspur-pensioner-study-2026.csv', csv)
    const base = `/api/orgs/${LARKSPUR}/imports/${up.body.id}`
    const info = await client.get<{ sheet: { name: string; headerGuess: number } }>(base)
    expect(info.body.sheet.headerGuess).toBe(4)
    const preview = await client.post<Preview>(`${base}/preview`, mapping([`M ${tag()}`, `F ${tag()}`], { sheet: info.body.sheet.name }))
    expect(preview.body.findings.map(f => f.message)).toEqual([`Sheet '${info.body.sheet.name}' C17: 'n/a' is not a number`])
  })
})

describe('validation rules', () => {
  it('reads thousands separators, percent strings and blank rows; flags duplicates as errors and unsorted rows as warnings', async () => {
    const client = await signedIn(DEMO.analyst)
    const base = await csvImport(client, 'age,salary,q\n20,"1,000.5",1.5%\n\n30,"1,250",2%\n25,1100,0.018\n30,1300,0.02\n')
    const m = csvMapping([{ index: 1, kind: 'salary', valueUnit: 'per-unit' }, { index: 2, kind: 'mortality', valueUnit: 'per-unit' }])
    const p = await client.post<Preview>(`${base}/preview`, m)
    expect(p.body.tables[0]!.sample).toEqual([{ x: '20', y: '1000.5' }, { x: '25', y: '1100' }, { x: '30', y: '1250' }])
    expect(p.body.tables[1]!.sample[0]).toEqual({ x: '20', y: '0.015' })
    expect(p.body.findings.filter(f => f.code === 'duplicate-axis').map(f => f.cell)).toEqual(['A6'])
    expect(p.body.findings.find(f => f.code === 'unsorted')).toMatchObject({ severity: 'warning', cell: 'A5' })
  })

  it('errors for q and lapse outside [0, 1] and formulas; warns for spot rates outside -5%..25%', async () => {
    const client = await signedIn(DEMO.analyst)
    const base = await csvImport(client, 'age,q,lapse,spot\n60,1.2,0.5,30%\n65,0.01,-0.1,0.02\n')
    const p = await client.post<Preview>(`${base}/preview`, csvMapping([{ index: 1, kind: 'mortality', valueUnit: 'per-unit' }, { index: 2, kind: 'lapse', valueUnit: 'per-unit' }, { index: 3, kind: 'spot-rate', valueUnit: 'per-unit' }]))
    const byCell = Object.fromEntries(p.body.findings.map(f => [f.cell, f.severity]))
    expect(byCell).toMatchObject({ B2: 'error', C3: 'error', D2: 'warning' })

    const wb = await workbook((w) => { const s = w.addWorksheet('F'); s.addRow(['age', 'q']); s.addRow([60, 0.01]); s.getCell('B3').value = { formula: 'B2*2', result: 0.02 } as never; s.getCell('A3').value = 65 })
    const up = await upload(client, LARKSPUR, 'formula.xlsx', wb)
    const fp = await client.post<Preview>(`/api/orgs/${LARKSPUR}/imports/${up.body.id}/preview`, { ...csvMapping([{ index: 1, kind: 'mortality', valueUnit: 'per-unit' }]), sheet: 'F' })
    expect(fp.body.findings.filter(f => f.severity === 'error')).toEqual([expect.objectContaining({ code: 'formula', cell: 'B3' })])
    expect(fp.body.findings[0]!.message).toContain('stale')
  })

  it('suggests percent or per mille from the header and from values above 1', async () => {
    const client = await signedIn(DEMO.analyst)
    const base = await csvImport(client, 'age,deaths per 1000,q_x,lapse %\n60,5.1,1.2,5\n65,7.9,1.9,4\n')
    const info = await client.get<{ columns: { valueUnit: string; unitReason: string | null }[] }>(base)
    expect(info.body.columns.slice(1).map(c => c.valueUnit)).toEqual(['per-mille', 'percent', 'percent'])
    expect(info.body.columns[2]!.unitReason).toContain('suggest percent')
  })

  it('needs warnings accepted explicitly, and sorts unsorted rows on create', async () => {
    const client = await signedIn(DEMO.analyst)
    const base = await csvImport(client, 'age,q\n70,0.03\n60,0.01\n65,0.02\n')
    const m = csvMapping([{ index: 1, kind: 'mortality', valueUnit: 'per-unit' }])
    const before = await footprint()
    expect((await client.post(`${base}/commit`, { mapping: m })).status).toBe(409)
    expect(await footprint()).toEqual(before)
    const done = await client.post<{ tables: { id: string }[] }>(`${base}/commit`, { mapping: m, acceptWarnings: true })
    expect(done.status).toBe(201)
    const v = await client.get<{ points: { x: string }[] }>(`/api/orgs/${LARKSPUR}/tables/${done.body.tables[0]!.id}/versions/1`)
    expect(v.body.points.map(p => p.x)).toEqual(['60', '65', '70'])
  })
})

describe('whose upload it is', () => {
  it('answers 404 to another member and to another organisation; the owner can discard it', async () => {
    const owner = await signedIn(DEMO.analyst)
    const base = await csvImport(owner, 'age,q\n60,0.01\n65,0.02\n')
    const actuary = await signedIn(DEMO.actuary)
    expect((await actuary.get(base)).status).toBe(404)
    const m = csvMapping([{ index: 1, kind: 'mortality', valueUnit: 'per-unit' }])
    expect((await actuary.post(`${base}/preview`, m)).status).toBe(404)
    expect((await actuary.post(`${base}/commit`, { mapping: m })).status).toBe(404)
    const felix = await signedIn(DEMO.both)
    expect((await felix.get(base.replace(LARKSPUR, FENWICK))).status).toBe(404)
    expect((await owner.req('DELETE', base)).status).toBe(200)
    expect((await owner.get(base)).status).toBe(404)
    expect(await count(`SELECT 1 FROM imports WHERE id = :id`, { id: base.split('/').pop() })).toBe(0)
  })
})
