import type { Sequelize, Transaction } from 'sequelize'
import { QueryTypes } from 'sequelize'
import { hashPassword } from '../../server/lib/password'
import { appendAuditEvent } from '../../server/services/audit-writer'
import type { Role } from '../../shared/permissions'

export const DEMO_PASSWORD = 'knotwork-demo-2026'

// Invented organisations and people (docs/domain.md#demo). Felix belongs to both.
export const DEMO_ORGS = [
  { slug: 'larkspur-mutual', name: 'Larkspur Mutual' },
  { slug: 'fenwick-rowe', name: 'Fenwick & Rowe Consulting' },
] as const

export const DEMO_PEOPLE: { email: string; name: string; roles: Partial<Record<(typeof DEMO_ORGS)[number]['slug'], Role>> }[] = [
  { email: 'hazel.okafor@larkspur.example', name: 'Hazel Okafor', roles: { 'larkspur-mutual': 'admin' } },
  { email: 'tomas.varga@larkspur.example', name: 'Tomas Varga', roles: { 'larkspur-mutual': 'actuary' } },
  { email: 'priya.raman@larkspur.example', name: 'Priya Raman', roles: { 'larkspur-mutual': 'analyst' } },
  { email: 'greta.lind@larkspur.example', name: 'Greta Lind', roles: { 'larkspur-mutual': 'auditor' } },
  { email: 'felix.amari@fenwickrowe.example', name: 'Felix Amari', roles: { 'larkspur-mutual': 'actuary', 'fenwick-rowe': 'actuary' } },
  { email: 'oona.pike@fenwickrowe.example', name: 'Oona Pike', roles: { 'fenwick-rowe': 'admin' } },
  { email: 'ravi.desai@fenwickrowe.example', name: 'Ravi Desai', roles: { 'fenwick-rowe': 'analyst' } },
  { email: 'mae.ellison@fenwickrowe.example', name: 'Mae Ellison', roles: { 'fenwick-rowe': 'auditor' } },
]

export interface SeededPeople {
  orgs: Record<string, string> // slug -> id
  users: Record<string, string> // email -> id
  list: { email: string; roles: string[] }[]
}

export async function seedPeople(db: Sequelize, t: Transaction): Promise<SeededPeople> {
  const orgs: Record<string, string> = {}
  const users: Record<string, string> = {}
  const insert = async (sql: string, replacements: Record<string, unknown>) =>
    (await db.query<{ id: string }>(sql, { replacements, type: QueryTypes.SELECT, transaction: t }))[0]!.id
  const at = () => new Date().toISOString()
  for (const o of DEMO_ORGS) {
    orgs[o.slug] = await insert('INSERT INTO organisations (name, slug) VALUES (:name, :slug) RETURNING id', o)
    await appendAuditEvent(db, { orgId: orgs[o.slug]!, actorId: null, actorEmail: 'demo-seed', action: 'org.create', objectType: 'organisation', objectId: orgs[o.slug]!, outcome: 'ok', requestId: null, ip: null, detail: { name: o.name, slug: o.slug, demo: true }, at: at() }, t)
  }
  const list: SeededPeople['list'] = []
  for (const p of DEMO_PEOPLE) {
    const id = await insert('INSERT INTO users (email, name, password_hash) VALUES (:email, :name, :hash) RETURNING id',
      { email: p.email, name: p.name, hash: await hashPassword(DEMO_PASSWORD) })
    users[p.email] = id
    for (const [slug, role] of Object.entries(p.roles)) {
      await db.query('INSERT INTO memberships (org_id, user_id, role) VALUES (:org, :user, :role)', { replacements: { org: orgs[slug], user: id, role }, transaction: t })
      await appendAuditEvent(db, { orgId: orgs[slug]!, actorId: null, actorEmail: 'demo-seed', action: 'member.add', objectType: 'user', objectId: id, outcome: 'ok', requestId: null, ip: null, detail: { role, demo: true }, at: at() }, t)
    }
    list.push({ email: p.email, roles: Object.entries(p.roles).map(([slug, role]) => `${role} at ${DEMO_ORGS.find(o => o.slug === slug)!.name}`) })
  }
  return { orgs, users, list }
}
