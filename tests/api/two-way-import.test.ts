// A matrix sheet becomes a two-way table (issue 17, part 2): the demo workbook (invented select table) read through the
// upload, the wizard's suggestion (header under the notes, durations and the ultimate column by heading, per mille),
// preview with cell-named findings, create in one transaction with the exact per-unit cells and the upload removed.
import { readFileSync } from 'node:fs'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { TableDto, VersionDto } from '#shared/types/tables'
import { demoSelectCells } from '~~/scripts/seed/select-table'
import { gridContentHash } from '~~/server/lib/points-hash'
import { Client, DEMO, LARKSPUR, closeOwnerDb, count, signedIn } from './helpers'
import { upload, workbook } from './import-helpers'

afterAll(closeOwnerDb)
let analyst: Client
beforeAll(async () => { analyst = await signedIn(DEMO.analyst) })
const DEMO_FILE = readFileSync('public/demo/larkspur-select-study-2026.xlsx')
type Suggestion = { headerRow: number, axisColumn: number, columns: number[], kind: string, valueUnit: string, hasUltimate: boolean }
type Preview = { findings: { code: string, cell: string | null, severity: string }[], rows: number, blanks: number, cellCount: number, errors: number, warnings: number }

describe('importing a matrix sheet', () => {
  it('suggests the layout of the demo workbook and creates the select table with its exact cells, the blanks left to fill', async () => {
    const up = await upload(analyst, LARKSPUR, 'larkspur-select-study-2026.xlsx', DEMO_FILE)
    expect(up.status).toBe(201)
    const base = `/api/orgs/${LARKSPUR}/imports/${up.body.id}`
    const d = await analyst.get<{ matrix: Suggestion }>(`${base}?sheet=${encodeURIComponent('Select 2026')}`)
    expect(d.body.matrix).toEqual(expect.objectContaining({ headerRow: 4, axisColumn: 0, columns: [1, 2, 3, 4, 5, 6], kind: 'mortality', valueUnit: 'per-mille', hasUltimate: true }))
    const name = `Select import ${Math.random().toString(36).slice(2, 8)}`
    const mapping = { sheet: 'Select 2026', headerRow: 4, axisColumn: 0, columns: [1, 2, 3, 4, 5, 6], axis: 'age', axisUnit: 'years', colAxis: 'duration', colAxisUnit: 'years', name, kind: 'mortality', valueUnit: 'per-mille' }
    const preview = await analyst.post<Preview>(`${base}/matrix-preview`, mapping)
    expect(preview.status).toBe(200)
    expect(preview.body).toMatchObject({ errors: 0, warnings: 0, rows: 41, cellCount: 9 * 6, blanks: 32 * 6 })
    const made = await analyst.post<TableDto>(`${base}/matrix-commit`, { mapping })
    expect(made.status).toBe(201)
    expect(made.body).toMatchObject({ shape: 'two-way', colAxis: 'duration', hasUltimate: true, valueUnit: 'per-mille' })
    const v = (await analyst.get<VersionDto>(`/api/orgs/${LARKSPUR}/tables/${made.body.id}/versions/1`)).body
    expect(v.cells).toEqual(demoSelectCells())
    expect(v.contentHash).toBe(gridContentHash(demoSelectCells()))
    expect(await count('SELECT 1 FROM imports WHERE id = :id', { id: up.body.id })).toBe(0)
    expect(await count(`SELECT 1 FROM audit_events WHERE action = 'import.commit' AND object_id = :id AND detail->>'layout' = 'matrix'`, { id: up.body.id })).toBe(1)
  })

  it('names the cells of problems and blocks the create until they are fixed (422), warnings need accepting (409)', async () => {
    const file = await workbook((wb) => {
      const ws = wb.addWorksheet('M')
      ws.addRows([['Age', 0, 1, 'Ult'], [40, 0.5, 'abc', 1.2], [45, 0.6, 0.8, 1.5], [50, 0.7, null, 1.9]])
    })
    const up = await upload(analyst, LARKSPUR, 'm.xlsx', file)
    const base = `/api/orgs/${LARKSPUR}/imports/${up.body.id}`
    const mapping = { sheet: 'M', headerRow: 0, axisColumn: 0, columns: [1, 2, 3], axis: 'age', axisUnit: 'years', colAxis: 'duration', colAxisUnit: 'years', name: `Matrix ${Math.random().toString(36).slice(2, 8)}`, kind: 'mortality', valueUnit: 'per-mille' }
    const p = await analyst.post<Preview>(`${base}/matrix-preview`, mapping)
    expect(p.body.findings.map(f => `${f.code}@${f.cell}`)).toEqual(['not-a-number@C2', 'not-rectangular@C2'])
    const blocked = await analyst.post<{ data: { code: string } }>(`${base}/matrix-commit`, { mapping })
    expect(blocked.status).toBe(422)
    expect(blocked.body.data.code).toBe('import-blocked')
    const fixed = { ...mapping, edits: { '1:2': '0.7' } }
    const warned = await analyst.post<{ data: { code: string } }>(`${base}/matrix-commit`, { mapping: fixed })
    expect(warned.status).toBe(409)
    expect(warned.body.data.code).toBe('import-warnings')
    expect((await analyst.post(`${base}/matrix-commit`, { mapping: fixed, acceptWarnings: true })).status).toBe(201)
  })
})
