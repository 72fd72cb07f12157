import { Sequelize } from 'sequelize'
import pg from 'pg'
import { afterAll, describe, expect, it } from 'vitest'
import { DEMO, LARKSPUR, closeOwnerDb, freshOrg, ownerDb, signedIn } from './helpers'
import type { AuditPageDto, AuditVerifyDto } from '#shared/types/audit'

afterAll(closeOwnerDb)

describe('audit trail', () => {
  it('the role the app connects with cannot UPDATE or DELETE audit rows or signed checkpoints', async () => {
    const url = process.env.NUXT_DATABASE_URL
    expect(url, 'NUXT_DATABASE_URL (the app role) must be set by scripts/env.sh').toBeTruthy()
    const app = new Sequelize(url!, { dialect: 'postgres', dialectModule: pg, logging: false, pool: { max: 1 } })
    try {
      const [[who]] = await app.query('SELECT current_user AS u') as [[{ u: string }], unknown]
      expect(who.u).toBe(process.env.KW_PG_APP ?? 'knotwork_app')
      for (const sql of ['UPDATE audit_events SET action = \'x\' WHERE id = (SELECT min(id) FROM audit_events)', 'DELETE FROM audit_events WHERE id = (SELECT min(id) FROM audit_events)', 'TRUNCATE audit_events',
        'UPDATE audit_checkpoints SET head_seq = 1', 'DELETE FROM audit_checkpoints', 'TRUNCATE audit_checkpoints']) {
        const error = await app.query(sql).then(() => null, (e: Error) => e)
        expect(error?.message, sql).toMatch(/permission denied/)
      }
    } finally { await app.close() }
  })

  it('an event edited behind the app\u2019s back is found: verify points at that event', async () => {
    const { client, orgId } = await freshOrg()
    const before = await client.get<AuditVerifyDto>(`/api/orgs/${(await client.get<{ memberships: { org: { id: string; slug: string } }[] }>('/api/me')).body.memberships[0]!.org.slug}/audit/verify`)
    expect(before.status).toBe(200)
    expect(before.body.chains.find(c => c.chain === 'org')?.intact).toBe(true)
    const [[victim]] = await ownerDb().query('SELECT id::text AS id FROM audit_events WHERE org_id = :orgId ORDER BY id LIMIT 1', { replacements: { orgId } }) as [[{ id: string }], unknown]
    await ownerDb().query(`ALTER TABLE audit_events DISABLE TRIGGER audit_events_no_change;
      UPDATE audit_events SET detail = detail || '{"tampered": true}'::jsonb WHERE id = ${Number(victim.id)};
      ALTER TABLE audit_events ENABLE TRIGGER audit_events_no_change;`)
    const slug = (await client.get<{ memberships: { org: { slug: string } }[] }>('/api/me')).body.memberships[0]!.org.slug
    const after = await client.get<AuditVerifyDto>(`/api/orgs/${slug}/audit/verify`)
    const chain = after.body.chains.find(c => c.chain === 'org')!
    expect(chain.intact).toBe(false)
    expect(chain.brokenAt?.id).toBe(victim.id)
    expect(chain.brokenAt?.reason).toMatch(/content does not match/)
  })

  it('lists the organisation\u2019s events with filters, pages, and members\u2019 sign-ins from the system trail', async () => {
    const auditor = await signedIn(DEMO.auditor)
    const signIns = await auditor.get<AuditPageDto>(`/api/orgs/${LARKSPUR}/audit?action=auth.sign-in&person=${encodeURIComponent(DEMO.auditor)}`)
    expect(signIns.status).toBe(200)
    expect(signIns.body.events.length).toBeGreaterThan(0)
    expect(signIns.body.events.every(e => e.chain === 'system' && e.action === 'auth.sign-in')).toBe(true)
    const page = await auditor.get<AuditPageDto>(`/api/orgs/${LARKSPUR}/audit?pageSize=10&page=2`)
    expect(page.body.events.length).toBeLessThanOrEqual(10)
    expect(page.body.total).toBeGreaterThan(10)
    const other = await signedIn(DEMO.otherAdmin)
    const theirs = await other.get<AuditPageDto>(`/api/orgs/fenwick-rowe/audit?action=auth.sign-in&person=${encodeURIComponent(DEMO.auditor)}`)
    expect(theirs.body.events).toEqual([]) // Greta is not a member of Fenwick & Rowe
    expect((await auditor.get(`/api/orgs/${LARKSPUR}/audit?from=2026-13-01`)).status).toBe(400)
  })
})
