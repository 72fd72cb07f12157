import { afterAll, describe, expect, it } from 'vitest'
import { Client, closeOwnerDb, count, freshOrg, signedIn, uniqueEmail } from './helpers'
import { tokenIn, waitForMail } from './fakes'

afterAll(closeOwnerDb)

type Me = { user: { id: string }; memberships: { role: string; org: { slug: string } }[] }

async function invite(admin: Client, slug: string, email: string, role: string) {
  return admin.post<{ id: string; statusMessage?: string; data?: { reason?: string; billing?: string } }>(`/api/orgs/${slug}/invitations`, { email, role })
}

/** Invites, reads the link from the fake inbox, and accepts with a new account; returns the new person signed in. */
async function inviteAndAccept(admin: Client, slug: string, role: string) {
  const email = uniqueEmail(role)
  expect((await invite(admin, slug, email, role)).status).toBe(201)
  const token = tokenIn(await waitForMail(email, 'Join'), '/invitations')
  const person = new Client()
  const accepted = await person.post<{ org: string; me: Me }>(`/api/invitations/${token}/accept`, { name: `New ${role}`, password: 'a long enough passphrase' })
  expect(accepted.status).toBe(200)
  return { person, email, token, userId: accepted.body.me.user.id }
}

describe('invitations', () => {
  it('e-mails a single-use link; the invitee sets a name and password and gets the invited role', async () => {
    const { client: admin, slug } = await freshOrg()
    const email = uniqueEmail('auditor')
    const created = await invite(admin, slug, email, 'auditor')
    expect(created.status).toBe(201)
    const mail = await waitForMail(email, 'Join')
    const token = tokenIn(mail, '/invitations')
    expect(token).toMatch(/^[A-Za-z0-9_-]{22}$/) // 128 random bits
    // stored only as its SHA-256 hash
    expect(await count('SELECT 1 FROM invitations WHERE token_hash = encode(sha256(convert_to(:t, \'UTF8\')), \'hex\')', { t: token })).toBe(1)
    expect(await count('SELECT 1 FROM invitations WHERE token_hash = :t', { t: token })).toBe(0)

    const preview = await new Client().get<{ email: string; role: string; hasAccount: boolean }>(`/api/invitations/${token}`)
    expect(preview.body).toMatchObject({ email, role: 'auditor', hasAccount: false })
    const person = new Client()
    expect((await person.post(`/api/invitations/${token}/accept`, { name: 'Ada', password: 'short' })).status).toBe(400)
    const accepted = await person.post<{ org: string; me: Me }>(`/api/invitations/${token}/accept`, { name: 'Ada Quill', password: 'a long enough passphrase' })
    expect(accepted.status).toBe(200)
    const me = await person.get<Me>('/api/me')
    expect(me.body.memberships).toEqual([expect.objectContaining({ role: 'auditor', org: expect.objectContaining({ slug }) })])
    // the auditor reads tables but not members
    expect((await person.get(`/api/orgs/${slug}/tables`)).status).toBe(200)
    expect((await person.get(`/api/orgs/${slug}/members`)).status).toBe(403)
    // single use
    expect((await new Client().post(`/api/invitations/${token}/accept`, { name: 'Again', password: 'a long enough passphrase' })).status).toBe(404)
    expect(await count(`SELECT 1 FROM audit_events a JOIN organisations o ON o.id = a.org_id WHERE o.slug = :slug AND a.action IN ('invitation.create', 'invitation.accept', 'member.add')`, { slug })).toBe(4)
  })

  it('lets a person with an account join by giving that account\u2019s password', async () => {
    const { client: admin, slug } = await freshOrg()
    const other = await freshOrg()
    expect((await invite(admin, slug, other.email, 'actuary')).status).toBe(201)
    const token = tokenIn(await waitForMail(other.email, 'Join'), '/invitations')
    expect((await new Client().get<{ hasAccount: boolean }>(`/api/invitations/${token}`)).body.hasAccount).toBe(true)
    expect((await new Client().post(`/api/invitations/${token}/accept`, { password: 'not the password at all' })).status).toBe(401)
    const joined = await new Client().post<{ me: Me }>(`/api/invitations/${token}/accept`, { password: other.password })
    expect(joined.status).toBe(200)
    expect(joined.body.me.memberships.map(m => `${m.org.slug}:${m.role}`).sort()).toEqual([`${other.slug}:admin`, `${slug}:actuary`].sort())
  })

  it('resend replaces the link; cancel frees the seat; an address already in the organisation is refused', async () => {
    const { client: admin, slug, email: adminEmail } = await freshOrg()
    const email = uniqueEmail('resend')
    const created = await invite(admin, slug, email, 'analyst')
    const first = await waitForMail(email, 'Join')
    expect((await admin.post(`/api/orgs/${slug}/invitations/${created.body.id}/resend`)).status).toBe(200)
    const second = await waitForMail(email, 'Join', first.id)
    expect((await new Client().get(`/api/invitations/${tokenIn(first, '/invitations')}`)).status).toBe(404)
    expect((await new Client().get(`/api/invitations/${tokenIn(second, '/invitations')}`)).status).toBe(200)
    expect((await admin.req('DELETE', `/api/orgs/${slug}/invitations/${created.body.id}`)).status).toBe(200)
    expect((await new Client().get(`/api/invitations/${tokenIn(second, '/invitations')}`)).status).toBe(404)
    expect((await invite(admin, slug, adminEmail, 'analyst')).status).toBe(409)
  })
})

describe('seats', () => {
  it('refuses an invitation beyond the purchased seats with 409 and a way to buy more', async () => {
    const { client: admin, slug } = await freshOrg() // a new organisation starts with 3 seats
    const seats = await admin.get<{ purchased: number; used: number }>(`/api/orgs/${slug}/seats`)
    expect(seats.body).toMatchObject({ purchased: 3, used: 1 })
    const a = await invite(admin, slug, uniqueEmail('a'), 'analyst')
    expect(a.status).toBe(201)
    expect((await invite(admin, slug, uniqueEmail('b'), 'analyst')).status).toBe(201)
    const refused = await invite(admin, slug, uniqueEmail('c'), 'analyst')
    expect(refused.status).toBe(409)
    expect(refused.body.statusMessage).toContain('Add seats')
    expect(refused.body.data).toMatchObject({ code: 'seats-full', billing: `/orgs/${slug}/billing` })
    expect((await admin.get<{ used: number }>(`/api/orgs/${slug}/seats`)).body.used).toBe(3)
    // cancelling an invitation frees its seat
    await admin.req('DELETE', `/api/orgs/${slug}/invitations/${a.body.id}`)
    expect((await invite(admin, slug, uniqueEmail('d'), 'analyst')).status).toBe(201)
  })
})

describe('roles and removal', () => {
  it('a role change takes effect on the next request', async () => {
    const { client: admin, slug } = await freshOrg()
    const { person, userId } = await inviteAndAccept(admin, slug, 'auditor')
    expect((await person.get(`/api/orgs/${slug}/members`)).status).toBe(403)
    expect((await admin.req('PATCH', `/api/orgs/${slug}/members/${userId}`, { role: 'admin' })).status).toBe(200)
    expect((await person.get(`/api/orgs/${slug}/members`)).status).toBe(200)
    expect((await admin.req('PATCH', `/api/orgs/${slug}/members/${userId}`, { role: 'analyst' })).status).toBe(200)
    expect((await person.get(`/api/orgs/${slug}/members`)).status).toBe(403)
    expect(await count(`SELECT 1 FROM audit_events a JOIN organisations o ON o.id = a.org_id WHERE o.slug = :slug AND a.action = 'member.role-change'`, { slug })).toBe(2)
  })

  it('the last administrator cannot give up the role or be removed', async () => {
    const { client: admin, slug } = await freshOrg()
    const me = await admin.get<Me>('/api/me')
    const demote = await admin.req<{ statusMessage: string }>('PATCH', `/api/orgs/${slug}/members/${me.body.user.id}`, { role: 'analyst' })
    expect(demote.status).toBe(409)
    expect(demote.body.statusMessage).toContain('at least one administrator')
    expect((await admin.req('DELETE', `/api/orgs/${slug}/members/${me.body.user.id}`)).status).toBe(409)
    expect((await admin.get(`/api/orgs/${slug}/members`)).status).toBe(200)
  })

  it('removal ends that membership\u2019s access at once and nothing else: the person\u2019s sessions and other organisation go on', async () => {
    const { client: admin, slug } = await freshOrg()
    const person = await freshOrg() // administrator of their own organisation
    expect((await invite(admin, slug, person.email, 'analyst')).status).toBe(201)
    const token = tokenIn(await waitForMail(person.email, 'Join'), '/invitations')
    const joined = await person.client.post<{ me: Me }>(`/api/invitations/${token}/accept`, {}) // signed in as the invitee
    expect(joined.status).toBe(200)
    const second = await signedIn(person.email, person.password)
    expect((await person.client.get(`/api/orgs/${slug}/tables`)).status).toBe(200)
    expect((await admin.req('DELETE', `/api/orgs/${slug}/members/${joined.body.me.user.id}`)).status).toBe(200)
    for (const session of [person.client, second]) {
      expect((await session.get(`/api/orgs/${slug}/tables`)).status).toBe(404)
      expect((await session.get(`/api/orgs/${person.slug}/tables`)).status).toBe(200)
      const me = await session.get<Me>('/api/me')
      expect(me.status).toBe(200)
      expect(me.body.memberships.map(m => m.org.slug)).toEqual([person.slug])
    }
    expect(await count('SELECT 1 FROM sessions s JOIN users u ON u.id = s.user_id WHERE u.email = :email AND s.revoked_at IS NOT NULL', { email: person.email })).toBe(0)
    expect((await admin.get<{ used: number }>(`/api/orgs/${slug}/seats`)).body.used).toBe(1)
  })
})

describe('password reset', () => {
  it('answers alike for any address, mails a single-use link, and ends every session', async () => {
    const { email, password } = await freshOrg()
    const session = await signedIn(email, password)
    const known = await new Client().post<{ message: string }>('/api/auth/password-reset', { email })
    const unknown = await new Client().post<{ message: string }>('/api/auth/password-reset', { email: uniqueEmail('nobody') })
    expect(known.status).toBe(200)
    expect(unknown.status).toBe(200)
    expect(unknown.body).toEqual(known.body)
    const token = tokenIn(await waitForMail(email, 'password'), '/reset-password')
    expect(await count('SELECT 1 FROM password_resets WHERE token_hash = :t', { t: token })).toBe(0)
    expect((await new Client().post('/api/auth/password-reset/confirm', { token, password: 'short' })).status).toBe(400)
    expect((await new Client().post('/api/auth/password-reset/confirm', { token, password: 'a fresh reset passphrase' })).status).toBe(200)
    expect((await session.get('/api/me')).status).toBe(401)
    expect((await new Client().post('/api/auth/login', { email, password })).status).toBe(401)
    await signedIn(email, 'a fresh reset passphrase')
    const reuse = await new Client().post<{ statusMessage: string }>('/api/auth/password-reset/confirm', { token, password: 'yet another passphrase' })
    expect(reuse.status).toBe(400)
  })

  it('refuses an expired link', async () => {
    const { email } = await freshOrg()
    await new Client().post('/api/auth/password-reset', { email })
    const token = tokenIn(await waitForMail(email, 'password'), '/reset-password')
    const { ownerDb } = await import('./helpers')
    await ownerDb().query(`UPDATE password_resets SET expires_at = now() - interval '1 second' WHERE token_hash = encode(sha256(convert_to(:t, 'UTF8')), 'hex')`, { replacements: { t: token } })
    expect((await new Client().post('/api/auth/password-reset/confirm', { token, password: 'a fresh reset passphrase' })).status).toBe(400)
  })

  it('does the same work before answering whatever the address: both answer while users and password_resets are locked', async () => {
    const { email } = await freshOrg()
    const nobody = uniqueEmail('nobody')
    const { ownerDb } = await import('./helpers')
    const t = await ownerDb().transaction()
    try {
      await ownerDb().query('LOCK TABLE users, password_resets IN ACCESS EXCLUSIVE MODE', { transaction: t })
      const waited = new Promise<never>((_, reject) => setTimeout(() => reject(new Error('a reset answer waited for the locked tables')), 20_000))
      const [known, unknown] = await Promise.race([Promise.all([
        new Client().post('/api/auth/password-reset', { email }),
        new Client().post('/api/auth/password-reset', { email: nobody }),
      ]), waited])
      expect([known.status, unknown.status]).toEqual([200, 200])
      expect(known.body).toEqual(unknown.body)
    } finally {
      await t.rollback()
    }
    // the lookup, the link and the mail came after the answer
    await waitForMail(email, 'password')
    expect(await count('SELECT 1 FROM audit_events WHERE action = \'auth.password-reset-request\' AND detail->>\'email\' = :email', { email: nobody })).toBe(0)
  })

  it('is throttled per client address (10 in 15 minutes) and per address asked about (5), alike for any address', async () => {
    const asker = new Client()
    for (let i = 0; i < 10; i++) expect((await asker.post('/api/auth/password-reset', { email: uniqueEmail('ask') })).status).toBe(200)
    const blocked = await asker.post('/api/auth/password-reset', { email: uniqueEmail('ask') })
    expect(blocked.status).toBe(429)
    expect(Number(blocked.headers.get('retry-after'))).toBeGreaterThan(0)
    const { email } = await freshOrg()
    for (const target of [email, uniqueEmail('nobody')]) {
      for (let i = 0; i < 5; i++) expect((await new Client().post('/api/auth/password-reset', { email: target })).status).toBe(200)
      expect((await new Client().post('/api/auth/password-reset', { email: target })).status).toBe(429)
    }
  })

  it('lifts a lock someone else put on the account: after a reset its owner signs in at once', async () => {
    const { email } = await freshOrg()
    for (let i = 0; i < 10; i++) expect((await new Client().post('/api/auth/login', { email, password: `someone else ${i}` })).status).toBe(401)
    expect((await new Client().post('/api/auth/login', { email, password: 'still guessing' })).status).toBe(429)
    await new Client().post('/api/auth/password-reset', { email })
    const token = tokenIn(await waitForMail(email, 'password'), '/reset-password')
    expect((await new Client().post('/api/auth/password-reset/confirm', { token, password: 'the owner\u2019s new passphrase' })).status).toBe(200)
    expect((await new Client().post('/api/auth/login', { email, password: 'the owner\u2019s new passphrase' })).status).toBe(200)
  })
})
