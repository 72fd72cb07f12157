import http from 'node:http'
import { afterAll, describe, expect, it } from 'vitest'
import { BASE, DEMO, LARKSPUR, closeOwnerDb, signedIn } from './helpers'
import { MINIMAL_PARTS, footprint, upload, workbook, zip } from './import-helpers'

afterAll(closeOwnerDb)

// Every hostile file must get a clear 4xx and leave nothing behind (no imports row, no tables, no versions).
async function refused(name: string, data: Buffer | string, status: number, words: RegExp) {
  const client = await signedIn(DEMO.analyst)
  const before = await footprint()
  const r = await upload(client, LARKSPUR, name, data)
  expect(r.status, JSON.stringify(r.body).slice(0, 300)).toBe(status)
  expect(r.body.statusMessage).toMatch(words)
  expect(await footprint()).toEqual(before)
}
const parts = (extra: Record<string, string | Buffer>) =>
  Object.entries({ ...MINIMAL_PARTS, ...extra }).map(([name, data]) => ({ name, data: Buffer.isBuffer(data) ? data : Buffer.from(data) }))

describe('upload size', () => {
  it('counts bytes as they arrive: a 200 MiB chunked upload without Content-Length is cut off at 20 MiB with 413', async () => {
    const client = await signedIn(DEMO.analyst)
    const before = await footprint()
    const url = new URL(`${BASE}/api/orgs/${LARKSPUR}/imports`)
    const outcome = await new Promise<{ status: number; sentMiB: number }>((resolve, reject) => {
      const req = http.request({ host: url.hostname, port: url.port, path: url.pathname, method: 'POST', headers: { 'cookie': client.cookie, 'x-forwarded-for': client.address, 'content-type': 'multipart/form-data; boundary=KW', 'transfer-encoding': 'chunked' } })
      let sent = 0
      let status = 0
      req.on('response', (res) => { status = res.statusCode ?? 0; res.resume(); res.on('end', () => resolve({ status, sentMiB: sent / 1048576 })) })
      req.on('error', () => (status ? resolve({ status, sentMiB: sent / 1048576 }) : reject(new Error('no response before the connection closed'))))
      expect(req.getHeader('content-length')).toBeUndefined()
      req.write('--KW\r\nContent-Disposition: form-data; name="file"; filename="big.csv"\r\nContent-Type: text/csv\r\n\r\n')
      const chunk = Buffer.alloc(256 * 1024, 'a')
      const pump = () => {
        while (!status && sent < 200 * 1048576) { sent += chunk.length; if (!req.write(chunk)) { req.once('drain', pump); return } }
        if (!status) req.end()
      }
      pump()
    })
    expect(outcome.status).toBe(413)
    expect(outcome.sentMiB).toBeLessThan(100) // the server stopped reading long before the end
    expect(await footprint()).toEqual(before)
  })
})

describe('xlsx zip guard', () => {
  it('refuses a zip bomb (one part inflating 1000:1) from the central directory', async () => {
    const bomb = zip(parts({ 'xl/worksheets/sheet1.xml': Buffer.alloc(100 * 1048576, 0x20) }))
    expect(bomb.length).toBeLessThan(1048576)
    await refused('bomb.xlsx', bomb, 422, /zip bomb/)
  })

  it('refuses a part that inflates beyond the size it declares (a lying central directory)', async () => {
    const body = Buffer.from(`<worksheet><sheetData>${'<row r="1"><c r="A1"><v>1</v></c></row>'.repeat(20_000)}</sheetData></worksheet>`)
    const lying = zip([...parts({}), { name: 'xl/worksheets/sheet1.xml', data: body, declaredSize: 1000 }])
    await refused('liar.xlsx', lying, 422, /more than it declares|damaged/)
  })

  it('refuses XML with a DOCTYPE before any parser sees it', async () => {
    const doctype = zip(parts({ 'xl/worksheets/sheet1.xml': '<?xml version="1.0"?><!DOCTYPE lol [<!ENTITY lol "lol">]><worksheet><sheetData><row r="1"><c r="A1" t="inlineStr"><is><t>&lol;</t></is></c></row></sheetData></worksheet>' }))
    await refused('doctype.xlsx', doctype, 422, /document type declaration/)
  })

  it('refuses a truncated zip with a clear message', async () => {
    const good = await workbook(wb => { wb.addWorksheet('S').addRow(['age', 'q']) })
    await refused('cut.xlsx', good.subarray(0, Math.floor(good.length / 2)), 400, /damaged or cut short/)
  })

  it('refuses a sheet with more than 200,000 rows before exceljs reads it', async () => {
    const rows = Array.from({ length: 200_002 }, (_, i) => `<row r="${i + 1}"><c r="A${i + 1}"><v>${i}</v></c></row>`).join('')
    await refused('tall.xlsx', zip(parts({ 'xl/worksheets/sheet1.xml': `<worksheet><sheetData>${rows}</sheetData></worksheet>` })), 413, /more than 200,000 rows/)
  })
})

describe('file kinds', () => {
  const ole = Buffer.concat([Buffer.from([0xd0, 0xcf, 0x11, 0xe0, 0xa1, 0xb1, 0x1a, 0xe1]), Buffer.alloc(4096)])
  it('names an encrypted workbook (OLE compound file) for what it is', async () => {
    await refused('secret.xlsx', ole, 415, /encrypted workbook or a legacy \.xls/)
  })
  it('refuses a legacy .xls with a clear message', async () => {
    await refused('old.xls', ole, 415, /legacy \.xls/)
  })
  it('refuses a workbook named .csv, and text named .xlsx', async () => {
    const real = await workbook(wb => { wb.addWorksheet('S').addRow(['age', 'q']) })
    await refused('tricky.csv', real, 415, /not text/)
    await refused('tricky.xlsx', 'age,q\n60,0.01\n', 415, /not an Excel workbook/)
  })
  it('refuses other extensions', async () => {
    await refused('notes.pdf', '%PDF-1.4', 415, /\.xlsx.*\.csv/)
  })
})

describe('row and column caps', () => {
  it('refuses a million-row CSV', async () => {
    const csv = `age,q\n${'60,0.01\n'.repeat(1_000_000)}`
    await refused('million.csv', csv, 413, /more than 200,000 rows/)
  })
  it('refuses more than 64 columns', async () => {
    const csv = `${Array.from({ length: 70 }, (_, i) => `c${i}`).join(',')}\n${Array.from({ length: 70 }, () => '1').join(',')}\n`
    await refused('wide.csv', csv, 413, /more than 64 columns/)
  })
})
