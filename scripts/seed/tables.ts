import { QueryTypes, type Sequelize, type Transaction } from 'sequelize'
import { appendAuditEvent } from '../../server/services/audit-writer'
import { pointsContentHash } from '../../server/lib/points-hash'
import { D, canonicalDecimal } from '../../shared/decimal-text'
import type { SeededPeople } from './people'

// Invented demo tables (docs/domain.md#demo). Values computed with decimal.js, stored as decimal text.
const INVENTED = 'Invented demo data for the Knotwork demo; not from any real study or market.'
type Point = { x: string; y: string }

/** Deterministic noise in [-1, 1] (a fixed sine sequence, so every seed run gives the same tables). */
const wobble = (i: number) => Math.sin(i * 12.9898 + 78.233) % 1

/** Makeham law mu_x = A + B c^x (Makeham 1860); q_x = 1 - exp(-(A + B c^x (c - 1) / ln c)), the force integrated over [x, x+1]. */
export function makehamQx(a: string, b: string, c: string, ages: number[], noise: number, salt: number): Point[] {
  const C = new D(c)
  const factor = C.minus(1).div(C.ln())
  return ages.map((x, i) => {
    const integrated = new D(a).plus(new D(b).mul(C.pow(x)).mul(factor))
    let q = new D(1).minus(integrated.neg().exp()).mul(1 + noise * wobble(i + salt))
    if (q.gte('0.99')) q = new D('0.99')
    return { x: String(x), y: canonicalDecimal(q.toSignificantDigits(6)) }
  })
}

/** Nelson-Siegel-Svensson spot rate (Svensson 1994), r(t) continuously compounded; stored as the annual rate e^r - 1. */
export function svenssonSpot(b0: number, b1: number, b2: number, b3: number, t1: number, t2: number, tenors: string[]): Point[] {
  return tenors.map((tenor) => {
    const t = new D(tenor)
    const e1 = t.div(t1).neg().exp()
    const e2 = t.div(t2).neg().exp()
    const l1 = new D(1).minus(e1).div(t.div(t1))
    const l2 = new D(1).minus(e2).div(t.div(t2))
    const r = new D(b0).plus(new D(b1).mul(l1)).plus(new D(b2).mul(l1.minus(e1))).plus(new D(b3).mul(l2.minus(e2)))
    return { x: tenor, y: canonicalDecimal(r.exp().minus(1).toDecimalPlaces(6)) }
  })
}

const AGES = Array.from({ length: 12 }, (_, i) => 55 + 5 * i)
const TENORS = ['0.25', '0.5', '1', '2', '3', '5', '7', '10', '15', '20', '30']

interface DemoTable {
  org: string; name: string; kind: string; axis: string; valueUnit: string; description: string; tags: string[]
  versions: { author: string; status: 'draft' | 'approved'; notes: string; points: Point[] }[]
}

function demoTables(): DemoTable[] {
  const male = makehamQx('0.0004', '0.000035', '1.098', AGES, 0.02, 1)
  const female = makehamQx('0.0003', '0.000021', '1.1', AGES, 0.02, 7)
  const maleDraft = male.map((p, i) => (i === 3 ? { ...p, y: canonicalDecimal(new D(p.y).mul('1.01').toSignificantDigits(6)) } : p))
  const tomas = 'tomas.varga@larkspur.example'
  const priya = 'priya.raman@larkspur.example'
  return [
    { org: 'larkspur-mutual', name: 'Pensioner mortality, male', kind: 'mortality', axis: 'age', valueUnit: 'per-unit', tags: ['pensioners', 'male'],
      description: `Pensioner q_x at ages 55 to 110 in steps of 5, from an invented Makeham law with a little noise. ${INVENTED}`,
      versions: [
        { author: tomas, status: 'approved', notes: 'Study 2025 basis, graduated.', points: male },
        { author: priya, status: 'draft', notes: 'Age 70 revised after the data cleanse.', points: maleDraft },
      ] },
    { org: 'larkspur-mutual', name: 'Pensioner mortality, female', kind: 'mortality', axis: 'age', valueUnit: 'per-unit', tags: ['pensioners', 'female'],
      description: `Pensioner q_x at ages 55 to 110 in steps of 5, from an invented Makeham law with a little noise. ${INVENTED}`,
      versions: [{ author: tomas, status: 'approved', notes: 'Study 2025 basis, graduated.', points: female }] },
    { org: 'larkspur-mutual', name: 'Lapse rates, regular premium savings', kind: 'lapse', axis: 'policy-year', valueUnit: 'percent', tags: ['lapse'],
      description: `Lapse rates by policy year. ${INVENTED}`,
      versions: [{ author: priya, status: 'draft', notes: 'From the 2026 persistency review.', points: [['1', '0.12'], ['2', '0.095'], ['3', '0.08'], ['4', '0.07'], ['5', '0.062'], ['10', '0.045'], ['15', '0.035'], ['20', '0.03']].map(([x, y]) => ({ x: x!, y: y! })) }] },
    { org: 'larkspur-mutual', name: 'Discount curve 2026-09-30', kind: 'spot-rate', axis: 'term', valueUnit: 'percent', tags: ['curve', '2026-09-30'],
      description: `Spot rates, annual compounding, at standard tenors, dated 2026-09-30, from invented Svensson parameters. ${INVENTED}`,
      versions: [{ author: tomas, status: 'approved', notes: 'Valuation date 2026-09-30.', points: svenssonSpot(0.032, -0.012, 0.018, -0.01, 1.8, 9, TENORS) }] },
    { org: 'larkspur-mutual', name: 'Salary scale, staff scheme', kind: 'salary', axis: 'age', valueUnit: 'per-unit', tags: ['salary'],
      description: `Salary index by age (age 20 = 1). ${INVENTED}`,
      versions: [{ author: tomas, status: 'draft', notes: 'Promotional scale plus 2.5% a year.', points: [20, 25, 30, 35, 40, 45, 50, 55, 60, 65].map(x => ({ x: String(x), y: canonicalDecimal(new D('1.025').pow(x - 20).mul(new D(1).plus(new D(Math.min(x - 20, 25)).mul('0.012'))).toDecimalPlaces(6)) })) }] },
    { org: 'fenwick-rowe', name: 'Client scheme mortality, unisex', kind: 'mortality', axis: 'age', valueUnit: 'per-unit', tags: ['client'],
      description: `Unisex q_x for a client scheme. ${INVENTED}`,
      versions: [{ author: 'ravi.desai@fenwickrowe.example', status: 'draft', notes: 'First cut for the client meeting.', points: makehamQx('0.00035', '0.000028', '1.099', AGES, 0.015, 3) }] },
  ]
}

export async function seedTables(db: Sequelize, t: Transaction, people: SeededPeople): Promise<void> {
  const one = async (sql: string, replacements: Record<string, unknown>) =>
    (await db.query<{ id: string }>(sql, { replacements, type: QueryTypes.SELECT, transaction: t }))[0]!.id
  for (const table of demoTables()) {
    const orgId = people.orgs[table.org]!
    const creator = table.versions[0]!.author
    const tableId = await one(`INSERT INTO rate_tables (org_id, name, kind, axis, value_unit, description, tags, created_by)
      VALUES (:orgId, :name, :kind, :axis, :valueUnit, :description, ARRAY[:tags]::text[], :createdBy) RETURNING id`,
    { orgId, name: table.name, kind: table.kind, axis: table.axis, valueUnit: table.valueUnit, description: table.description, tags: table.tags, createdBy: people.users[creator] })
    await appendAuditEvent(db, { orgId, actorId: people.users[creator]!, actorEmail: creator, action: 'table.create', objectType: 'rate_table', objectId: tableId, outcome: 'ok', requestId: null, ip: null, detail: { name: table.name, demo: true }, at: new Date().toISOString() }, t)
    for (const [i, v] of table.versions.entries()) {
      const hash = pointsContentHash(v.points)
      const versionId = await one(`INSERT INTO table_versions (org_id, table_id, number, status, author_id, notes, content_hash)
        VALUES (:orgId, :tableId, :number, :status, :author, :notes, :hash) RETURNING id`,
      { orgId, tableId, number: i + 1, status: v.status, author: people.users[v.author], notes: v.notes, hash })
      for (const p of v.points) {
        await db.query('INSERT INTO version_points (version_id, x, y) VALUES (:versionId, :x::numeric, :y::numeric)', { replacements: { versionId, ...p }, transaction: t })
      }
      await appendAuditEvent(db, { orgId, actorId: people.users[v.author]!, actorEmail: v.author, action: 'version.create', objectType: 'table_version', objectId: versionId, outcome: 'ok', requestId: null, ip: null, detail: { tableId, number: i + 1, status: v.status, points: v.points.length, contentHash: hash, demo: true }, at: new Date().toISOString() }, t)
    }
  }
}
