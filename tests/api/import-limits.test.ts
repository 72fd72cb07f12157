import http from 'node:http'
import { afterAll, describe, expect, it } from 'vitest'
import { BASE, type Client, DEMO, LARKSPUR, ORIGIN, closeOwnerDb, count, ownerDb, signedIn } from './helpers'
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
      const req = http.request({ host: url.hostname, port: url.port, path: url.pathname, method: 'POST', headers: { 'cookie': client.cookie, 'origin': ORIGIN, 'x-forwarded-for': client.address, 'content-type': 'multipart/form-data; boundary=KW', 'transfer-encoding': 'chunked' } })
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

describe('limits by work', () => {
  it('refuses an upload over 1,000,000 cells (rows × columns), naming the count and the limit', async () => {
    const row = Array.from({ length: 50 }, (_, i) => `0.0${i}`).join(',')
    const csv = `${Array.from({ length: 20_001 }, () => row).join('\n')}\n`
    await refused('cells.csv', csv, 413, /20,001 rows × 50 columns = 1,000,050 cells; an upload may have at most 1,000,000/)
  })

  it('refuses more than 32 value columns in one import, naming the limit', async () => {
    const client = await signedIn(DEMO.analyst)
    const header = ['age', ...Array.from({ length: 34 }, (_, i) => `q${i}`)].join(',')
    const up = await upload(client, LARKSPUR, 'many.csv', `${header}\n60,${Array.from({ length: 34 }, () => '0.01').join(',')}\n65,${Array.from({ length: 34 }, () => '0.02').join(',')}\n`)
    expect(up.status).toBe(201)
    const mapping = (n: number) => ({ sheet: up.body.sheets[0]!.name, headerRow: 0, axisColumn: 0, axis: 'age', axisUnit: 'years', edits: {}, description: '',
      columns: Array.from({ length: n }, (_, i) => ({ index: i + 1, name: `Many columns ${i} ${up.body.id}`, kind: 'mortality', valueUnit: 'per-unit' })) })
    const tooMany = await client.post<{ statusMessage: string }>(`/api/orgs/${LARKSPUR}/imports/${up.body.id}/preview`, mapping(33))
    expect(tooMany.status).toBe(400)
    expect(tooMany.body.statusMessage).toMatch(/at most 32 value columns per import/)
    expect((await client.post(`/api/orgs/${LARKSPUR}/imports/${up.body.id}/preview`, mapping(32))).status).toBe(200)
    await client.req('DELETE', `/api/orgs/${LARKSPUR}/imports/${up.body.id}`)
  })
})

describe('concurrent imports per person', () => {
  /** An upload whose body arrives slowly: it holds an import slot until `finish` (or `abort`). */
  function slowUpload(client: Client) {
    const url = new URL(`${BASE}/api/orgs/${LARKSPUR}/imports`)
    let status = 0
    const req = http.request({ host: url.hostname, port: url.port, path: url.pathname, method: 'POST', headers: { 'cookie': client.cookie, 'origin': ORIGIN, 'x-forwarded-for': client.address, 'content-type': 'multipart/form-data; boundary=KW', 'transfer-encoding': 'chunked' } })
    const answered = new Promise<number>((resolve) => {
      req.on('response', (res) => { status = res.statusCode ?? 0; res.resume(); res.on('end', () => resolve(status)) })
      req.on('error', () => resolve(status))
    })
    req.write('--KW\r\nContent-Disposition: form-data; name="file"; filename="slow.csv"\r\nContent-Type: text/csv\r\n\r\nage,q\n60,0.01\n')
    return { answered, finish: () => req.end('65,0.02\n\r\n--KW--\r\n'), abort: () => req.destroy() }
  }
  const slotsOf = (email: string) => count('SELECT 1 FROM import_slots s JOIN users u ON u.id = s.user_id WHERE u.email = :email', { email })

  it('a third upload while two are being read gets 429 with Retry-After; another person is not held up; slots are given back', async () => {
    const client = await signedIn(DEMO.analyst)
    const first = slowUpload(client)
    const second = slowUpload(client)
    for (let i = 0; i < 600 && await slotsOf(DEMO.analyst) < 2; i++) await new Promise(resolve => setTimeout(resolve, 50))
    expect(await slotsOf(DEMO.analyst)).toBe(2)
    const third = await upload(client, LARKSPUR, 'third.csv', 'age,q\n60,0.01\n65,0.02\n')
    expect(third.status).toBe(429)
    expect(Number(third.headers.get('retry-after'))).toBeGreaterThan(0)
    expect(third.body.statusMessage).toMatch(/already have 2 imports being read or checked/)
    const colleague = await signedIn(DEMO.actuary)
    const theirs = await upload(colleague, LARKSPUR, 'theirs.csv', 'age,q\n60,0.01\n65,0.02\n')
    expect(theirs.status).toBe(201)
    first.finish()
    second.abort()
    expect(await first.answered).toBe(201)
    for (let i = 0; i < 600 && await slotsOf(DEMO.analyst) > 0; i++) await new Promise(resolve => setTimeout(resolve, 50))
    expect(await slotsOf(DEMO.analyst)).toBe(0)
    expect((await upload(client, LARKSPUR, 'fourth.csv', 'age,q\n60,0.01\n65,0.02\n')).status).toBe(201)
  })

  it('slots left by a crashed node expire', async () => {
    await ownerDb().query(`INSERT INTO import_slots (user_id, work, started_at, expires_at)
      SELECT id, 'upload', now() - interval '10 minutes', now() - interval '1 minute' FROM users, generate_series(1, 2) WHERE email = :email`, { replacements: { email: DEMO.analyst } })
    const client = await signedIn(DEMO.analyst)
    expect((await upload(client, LARKSPUR, 'after-crash.csv', 'age,q\n60,0.01\n65,0.02\n')).status).toBe(201)
  })
})
