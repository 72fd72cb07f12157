// Re-checks an audit trail exported as CSV (Audit trail page, "Download as CSV"), without Knotwork and without its database.
//   npx tsx scripts/verify-audit-csv.ts trail.csv [--head <number>:<hash>]
// For every row: SHA-256(previous hash + "\n" + hashed record) must equal the row's hash (the chain's rule,
// server/lib/audit-chain.ts; the first event's previous hash is the word "genesis"); and where two rows of one trail have
// consecutive numbers, the later one must name the earlier one's hash as its previous hash. --head checks that the CSV
// still holds an event you recorded earlier (the number and hash on the Signature sheet of a signed workbook, or in a
// read-API answer's auditHead): removing the newest events leaves a chain that still links up, so only such a head shows it.
import { createHash } from 'node:crypto'
import { readFileSync } from 'node:fs'
import path from 'node:path'
import { fileURLToPath } from 'node:url'
import { parse } from 'csv-parse/sync'

export interface CsvCheck { events: number; problems: string[]; newest: Map<string, { number: number; hash: string }>; head?: string }

export function checkAuditCsv(text: string, head?: { number: number; hash: string }): CsvCheck {
  const rows = parse(text.replace(/^\uFEFF/, ''), { relax_column_count: true }) as string[][]
  const header = rows.shift() ?? []
  const col = (name: string) => header.indexOf(name)
  const [n, trail, hash, prev, record] = ['Number', 'Trail', 'Hash', 'Previous hash', 'Hashed record (RFC 8785 JSON)'].map(col)
  if ([n, trail, hash, prev, record].some(i => i === undefined || i < 0)) return { events: 0, problems: ['This is not a Knotwork audit-trail CSV (a column is missing).'], newest: new Map() }
  const problems: string[] = []
  const newest = new Map<string, { number: number; hash: string }>()
  const last = new Map<string, { number: number; hash: string }>()
  let found = false
  for (const row of rows) {
    const number = Number(row[n!])
    const name = row[trail!]!
    const own = row[hash!]!
    if (createHash('sha256').update(`${row[prev!]}\n${row[record!]}`).digest('hex') !== own) problems.push(`Event #${number} (${name}): its record does not match its hash.`)
    const before = last.get(name)
    if (before && before.number + 1 === number && row[prev!] !== before.hash) problems.push(`Event #${number} (${name}) does not link to event #${before.number}.`)
    if (!before && number === 1 && row[prev!] !== 'genesis') problems.push(`Event #1 (${name}) should follow "genesis".`)
    if (head && number === head.number && name !== 'System (sign-ins)') found = own === head.hash
    last.set(name, { number, hash: own })
    if (!newest.has(name) || newest.get(name)!.number < number) newest.set(name, { number, hash: own })
  }
  const verdict = head ? (found ? `The CSV holds event #${head.number} with that hash.` : `The CSV does not hold event #${head.number} with that hash: it was removed or changed after the head was recorded.`) : undefined
  if (head && !found) problems.push(verdict!)
  return { events: rows.length, problems, newest, head: verdict }
}

function main() {
  const args = process.argv.slice(2)
  const at = args.indexOf('--head')
  const given = at >= 0 ? args.splice(at, 2)[1] : undefined
  const [file] = args
  if (!file) { console.error('usage: npx tsx scripts/verify-audit-csv.ts trail.csv [--head <number>:<hash>]'); process.exit(2) }
  const head = given ? { number: Number(given.split(':')[0]), hash: given.split(':')[1] ?? '' } : undefined
  const result = checkAuditCsv(readFileSync(file, 'utf8'), head)
  console.log(`${result.events} events checked`)
  for (const [trail, h] of result.newest) console.log(`newest of ${trail}: #${h.number}, hash ${h.hash}`)
  if (result.head) console.log(result.head)
  for (const p of result.problems) console.log(`PROBLEM: ${p}`)
  console.log(result.problems.length ? 'NOT INTACT' : 'INTACT: every hash and every link between consecutive events holds')
  process.exit(result.problems.length ? 1 : 0)
}

if (process.argv[1] && fileURLToPath(import.meta.url) === path.resolve(process.argv[1])) main()
