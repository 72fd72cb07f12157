// A signed-off two-way table carries its second axis into the signed workbook (format 3), the read API and the version
// diff (issue 17, part 5); the verifier checks every cell of a format-3 file and names a changed one. Format-1 and
// format-2 files keep verifying (tests/unit/export/old-exports.test.ts; tests/api/export.test.ts for new one-way files).
import ExcelJS from 'exceljs'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { TableDto, VersionDto } from '#shared/types/tables'
import type { ExportVerdictDto } from '#shared/types/exports'
import type { VersionDiffDto } from '#shared/types/diff'
import { demoSelectCells } from '~~/scripts/seed/select-table'
import { canonicalBytes, readWorkbookCells, verifyBytes, type SignedContentV3 } from '~~/server/lib/signing'
import { BASE, Client, DEMO, LARKSPUR, closeOwnerDb, signedIn } from './helpers'

afterAll(closeOwnerDb)
let analyst: Client, felix: Client, auditor: Client, admin: Client
let tableId: string
const base = () => `/api/orgs/${LARKSPUR}/tables/${tableId}`
beforeAll(async () => {
  [analyst, felix, auditor, admin] = await Promise.all([signedIn(DEMO.analyst), signedIn(DEMO.both), signedIn(DEMO.auditor), signedIn(DEMO.admin)])
  const made = await analyst.post<TableDto>(`/api/orgs/${LARKSPUR}/tables/two-way`, {
    name: `Select export ${Math.random().toString(36).slice(2, 8)}`, kind: 'mortality', axis: 'age', colAxis: 'duration', hasUltimate: true, valueUnit: 'per-mille', cells: demoSelectCells(),
  })
  tableId = made.body.id
  const v = (await analyst.get<VersionDto>(`${base()}/versions/1`)).body
  const fill = await analyst.post(`${base()}/versions/1/grid-fill`, {
    grid: { x: { from: '30', to: '70', step: '1' }, d: { from: '0', to: '4', step: '1' } }, choice: { x: { method: 'linear' }, d: { method: 'linear' } },
    rationale: 'Straight lines both ways for the export test.', money: { ages: [40] }, lockVersion: v.lockVersion,
  })
  expect(fill.status).toBe(200)
  expect((await analyst.post(`${base()}/versions/1/submit`, {})).status).toBe(200)
  expect((await felix.post(`${base()}/versions/1/approve`, {})).status).toBe(200)
})

async function download(client: Client, path: string): Promise<Buffer> {
  const res = await fetch(`${BASE}${path}/export`, { headers: { cookie: client.cookie, 'x-forwarded-for': client.address } })
  expect(res.status).toBe(200)
  return Buffer.from(await res.arrayBuffer())
}
async function check(client: Client, file: Buffer) {
  const form = new FormData()
  form.append('file', new Blob([new Uint8Array(file)]), 'select.xlsx')
  return client.req<ExportVerdictDto>('POST', `/api/orgs/${LARKSPUR}/exports/verify`, form)
}

describe('a signed two-way table', () => {
  it('exports as format 3 with rows, columns and the ultimate column, verifies as genuine, and a changed cell is named', async () => {
    const file = await download(auditor, `${base()}/versions/1`)
    const r = await check(auditor, file)
    expect(r.body.verdict).toBe('genuine-current')
    expect(r.body.signed).toMatchObject({ format: 'knotwork-signed-table/3', points: 54, values: 41 * 6 })
    const sheets = await readWorkbookCells(file)
    const given = sheets.get('Given cells')!
    expect(given[0]).toEqual(['Age (years)', 'Duration (years)', 'q_x (per mille)', 'q_x (per mille), every digit', 'q_x per unit, every digit'])
    expect(given[1]).toEqual([30, 0, 0.5376, '0.5376', '0.0005376'])
    expect(given[6]).toEqual([30, 'Ultimate', 1.2517, '1.2517', '0.0012517'])
    expect(sheets.get('About this table')!.flat()).toContain('Method along age')

    const wb = new ExcelJS.Workbook()
    await wb.xlsx.load(file as unknown as ArrayBuffer)
    wb.getWorksheet('Filled values')!.getCell('D3').value = '0.9999'
    const altered = await check(auditor, Buffer.from(await wb.xlsx.writeBuffer()))
    expect(altered.body.verdict).toBe('altered')
    expect(altered.body.differences?.map(d => d.cell)).toEqual(['Filled values!D3'])
  })

  it('downloads unsigned as CSV: the filled values and the given cells as matrices, rows down and columns across, every digit', async () => {
    const res = await fetch(`${BASE}${base()}/versions/1/download?format=csv`, { headers: { cookie: auditor.cookie, 'x-forwarded-for': auditor.address } })
    expect(res.status).toBe(200)
    expect(res.headers.get('content-type')).toMatch(/text\/csv/)
    const lines = (await res.text()).replace(/^\uFEFF/, '').split('\r\n')
    expect(lines[0]).toMatch(/^"?NOT SIGNED OFF/)
    const filled = lines.indexOf('Filled values')
    expect(lines[filled + 1]).toBe('"Age (years) down, duration (years) across",0,1,2,3,4,Ultimate')
    expect(lines[filled + 2]).toBe('30,0.5376,' + lines[filled + 2]!.split(',').slice(2).join(','))
    expect(lines.slice(filled + 2).findIndex(l => l === '')).toBe(41) // ages 30 to 70
    const given = lines.indexOf('Given cells (blank: filled above)')
    expect(given).toBeGreaterThan(filled)
    expect(lines[given + 2]!.split(',')[6]).toBe('1.2517') // age 30, ultimate, per mille
  })

  it('the read API answers the signed cells (format 3) under a signature that holds', async () => {
    const t = await admin.post<{ token: string }>(`/api/orgs/${LARKSPUR}/read-tokens`, { name: `Select reader ${Math.random().toString(36).slice(2, 6)}` })
    const res = await fetch(`${BASE}/api/v1/tables/${tableId}`, { headers: { authorization: `Bearer ${t.body.token}`, accept: 'application/json' } })
    expect(res.status).toBe(200)
    const body = await res.json() as { content: SignedContentV3, signature: string, keyId: string }
    expect(body.content.format).toBe('knotwork-signed-table/3')
    expect(body.content.table).toMatchObject({ shape: 'two-way', colAxis: 'duration', hasUltimate: true })
    expect(body.content.cells).toContainEqual(['30', null, '0.0012517'])
    expect(body.content.fill!.values).toHaveLength(246)
    const jwks = await (await fetch(`${BASE}/api/keys/${LARKSPUR}.json`)).json() as { keys: { kid: string, x: string }[] }
    expect(verifyBytes(canonicalBytes(body.content), body.signature, jwks.keys.find(k => k.kid === body.keyId)!.x)).toBe(true)
  })

  it('the diff of two versions compares cells by row and column', async () => {
    const next = await analyst.post<VersionDto>(`${base()}/versions`, { fromNumber: 1 })
    const cells = next.body.cells.map(c => (c.x === '45' && c.d === '2' ? { ...c, y: '0.0016' } : c))
    expect((await analyst.req('PUT', `${base()}/versions/2/cells`, { lockVersion: next.body.lockVersion, cells })).status).toBe(200)
    const diff = await analyst.get<VersionDiffDto>(`${base()}/diff?a=1&b=2`)
    expect(diff.status).toBe(200)
    expect(diff.body.points.changed).toBe(1)
    expect(diff.body.points.rows.find(r => r.change === 'changed')).toMatchObject({ x: '45 / 2', b: '0.0016' })
    expect(diff.body.points.rows.at(-1)!.x).toBe('70 / ultimate')
    expect(diff.body.a.method).toBe('linear × linear')
  })
})
