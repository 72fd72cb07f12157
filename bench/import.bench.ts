// npm run bench:import: a 50,000-row x 4-value-column .xlsx through the import pipeline
// (read + guard + parse -> header/columns -> preview validation -> canonical points + content hash),
// in-process through the same library functions the services call. Prints time and peak RSS.
// Targets: <= 10 s and <= 400 MB peak RSS. Database writes are timed separately over HTTP by the API tests.
import { execFileSync } from 'node:child_process'
import { existsSync, mkdirSync, readFileSync, writeFileSync } from 'node:fs'
import ExcelJS from 'exceljs'
import { readWorkbook } from '../server/lib/import/read-workbook'
import { proposeHeaderRow, suggestColumns } from '../server/lib/import/analyse'
import { validateMapping } from '../server/lib/import/validate'
import { pointsContentHash } from '../server/lib/points-hash'

const ROWS = 50_000
let peak = process.memoryUsage().rss
const sampler = setInterval(() => { peak = Math.max(peak, process.memoryUsage().rss) }, 10)

async function makeWorkbook(): Promise<Buffer> {
  const wb = new ExcelJS.Workbook()
  const ws = wb.addWorksheet('Big study')
  ws.addRow(['Notes: invented benchmark data'])
  ws.addRow([])
  ws.addRow(['Age', 'Male q_x (%)', 'Female q_x (%)', 'Lapse (%)', 'Spot rate (%)'])
  for (let i = 0; i < ROWS; i++) ws.addRow([i / 100, (0.1 + i / ROWS * 50).toFixed(6), (0.08 + i / ROWS * 40).toFixed(6), (5 - i / ROWS * 2).toFixed(4), (2 + i / ROWS).toFixed(5)].map(Number))
  return Buffer.from(await wb.xlsx.writeBuffer())
}

// The workbook is written by a child process, so building it does not count in this process's memory.
const PATH = '.data/bench/import-50k.xlsx'
if (process.argv[2] === '--make') {
  mkdirSync('.data/bench', { recursive: true })
  writeFileSync(PATH, await makeWorkbook())
  process.exit(0)
}
if (!existsSync(PATH)) execFileSync(process.execPath, [...process.execArgv, process.argv[1]!, '--make'], { stdio: 'inherit' })
const file = readFileSync(PATH)
const rssBefore = process.memoryUsage().rss
peak = rssBefore
const t0 = performance.now()
const { sheets } = await readWorkbook('bench.xlsx', file)
const t1 = performance.now()
const sheet = sheets[0]!
const header = proposeHeaderRow(sheet.rows)
const columns = suggestColumns(sheet, header)
const values = columns.filter(c => c.role === 'value')
const mapping = { sheet: sheet.name, headerRow: header, axisColumn: 0, axis: 'age' as const, axisUnit: 'years' as const, edits: {}, description: '',
  columns: values.map(c => ({ index: c.index, name: c.header, kind: c.kind === 'other' ? 'mortality' as const : c.kind, valueUnit: c.valueUnit })) }
const json = JSON.stringify(sheets) // what the imports row stores
const t2 = performance.now()
const v = validateMapping(JSON.parse(json)[0], mapping)
const t3 = performance.now()
const hashes = v.tables.map(t => pointsContentHash(t.points))
const t4 = performance.now()
clearInterval(sampler)

const points = v.tables.reduce((n, t) => n + t.points.length, 0)
console.log(`import bench: ${ROWS.toLocaleString('en-GB')} rows x ${values.length} value columns, file ${(file.length / 1048576).toFixed(1)} MiB, stored JSON ${(json.length / 1048576).toFixed(1)} MiB`)
console.log(`  read+guard+parse  ${(t1 - t0).toFixed(0)} ms`)
console.log(`  header+columns    ${(t2 - t1).toFixed(0)} ms (header row ${header + 1})`)
console.log(`  preview validate  ${(t3 - t2).toFixed(0)} ms (${v.findings.length} findings, ${points.toLocaleString('en-GB')} points)`)
console.log(`  content hashes    ${(t4 - t3).toFixed(0)} ms (${hashes.length} tables)`)
console.log(`  total             ${(t4 - t0).toFixed(0)} ms   (target <= 10000 ms)`)
console.log(`  peak RSS          ${(peak / 1048576).toFixed(0)} MiB (before: ${(rssBefore / 1048576).toFixed(0)} MiB; target <= 400 MB)`)
if (t4 - t0 > 10_000 || peak > 400e6) process.exitCode = 1

// Optional end-to-end run over HTTP (upload -> preview -> commit with database writes) against a running
// built server: KW_BENCH_BASE_URL=http://127.0.0.1:3400 [KW_BENCH_SERVER_PID=<pid> for the server's peak RSS].
// Changes name the app's origin as a browser does (the server refuses others); the server's NUXT_PUBLIC_BASE_URL must match.
const base = process.env.KW_BENCH_BASE_URL
if (base) {
  const origin = new URL(base).origin
  const login = await fetch(`${base}/api/auth/login`, { method: 'POST', headers: { 'content-type': 'application/json', 'x-forwarded-for': '10.99.0.1', origin }, body: JSON.stringify({ email: 'priya.raman@larkspur.example', password: 'knotwork-demo-2026' }) })
  const cookie = login.headers.getSetCookie().map(c => c.split(';')[0]).join('; ')
  const headers = { cookie, 'x-forwarded-for': '10.99.0.1', 'accept': 'application/json', origin }
  const form = new FormData()
  form.append('file', new Blob([new Uint8Array(file)]), 'bench.xlsx')
  const h0 = performance.now()
  const up = await (await fetch(`${base}/api/orgs/larkspur-mutual/imports`, { method: 'POST', headers, body: form })).json() as { id: string }
  const h1 = performance.now()
  const suffix = Date.now().toString(36)
  const httpMapping = { ...mapping, columns: mapping.columns.map(c => ({ ...c, name: `${c.name} bench ${suffix}` })) }
  const jsonHeaders = { ...headers, 'content-type': 'application/json' }
  const preview = await (await fetch(`${base}/api/orgs/larkspur-mutual/imports/${up.id}/preview`, { method: 'POST', headers: jsonHeaders, body: JSON.stringify(httpMapping) })).json() as { errors: number }
  const h2 = performance.now()
  const commit = await fetch(`${base}/api/orgs/larkspur-mutual/imports/${up.id}/commit`, { method: 'POST', headers: jsonHeaders, body: JSON.stringify({ mapping: httpMapping, acceptWarnings: true }) })
  const h3 = performance.now()
  const pid = process.env.KW_BENCH_SERVER_PID
  const hwm = pid ? /VmHWM:\s+(\d+)/.exec(readFileSync(`/proc/${pid}/status`, 'utf8'))?.[1] : undefined
  console.log(`import over HTTP (${base}): upload+parse ${(h1 - h0).toFixed(0)} ms, preview ${(h2 - h1).toFixed(0)} ms (${preview.errors} errors), commit ${(h3 - h2).toFixed(0)} ms (status ${commit.status}), total ${(h3 - h0).toFixed(0)} ms`)
  if (hwm) console.log(`  server peak RSS (VmHWM) ${(Number(hwm) / 1024).toFixed(0)} MiB`)
}
