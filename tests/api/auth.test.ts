import { afterAll, describe, expect, it } from 'vitest'
import { Client, DEMO, FENWICK, LARKSPUR, closeOwnerDb, count, freshOrg, ownerDb, signedIn, uniqueEmail } from './helpers'
import { INBOX, waitForMail } from './fakes'

afterAll(closeOwnerDb)

describe('sign-up', () => {
  it('creates an organisation and makes the person its admin, signed in', async () => {
    const { client, slug, email } = await freshOrg('Quillmoor Friendly Society')
    expect(slug).toMatch(/^quillmoor-friendly-society/)
    const me = await client.get<{ user: { email: string }; memberships: { role: string; org: { slug: string } }[] }>('/api/me')
    expect(me.status).toBe(200)
    expect(me.body.user.email).toBe(email)
    expect(me.body.memberships).toEqual([expect.objectContaining({ role: 'admin', org: expect.objectContaining({ slug }) })])
    expect(await count(`SELECT 1 FROM audit_events a JOIN organisations o ON o.id = a.org_id WHERE o.slug = :slug AND a.action = 'org.create'`, { slug })).toBe(1)
  })

  it('refuses a short password with a message a person can act on', async () => {
    const r = await new Client().post<{ statusMessage: string }>('/api/auth/signup', { name: 'A', email: uniqueEmail(), password: 'short', organisation: 'Short Co' })
    expect(r.status).toBe(400)
    expect(r.body.statusMessage).toContain('at least 12 characters')
  })

  it('stores the password with scrypt at OWASP cost (N=2^17, r=8, p=1), never in clear', async () => {
    const { email, password } = await freshOrg()
    const [rows] = await ownerDb().query('SELECT password_hash FROM users WHERE email = :email', { replacements: { email } })
    const hash = (rows as { password_hash: string }[])[0]!.password_hash
    expect(hash).toMatch(/^\$scrypt\$ln=17,r=8,p=1\$/)
    expect(hash).not.toContain(password)
  })
})

describe('sign-in and sign-out', () => {
  it('signs in with the right password and answers 401 otherwise, with the same words for an unknown e-mail', async () => {
    const ok = await new Client().post('/api/auth/login', { email: DEMO.analyst, password: 'knotwork-demo-2026' })
    expect(ok.status).toBe(200)
    expect(ok.headers.getSetCookie().join()).toContain('knotwork-session=')
    const wrong = await new Client().post<{ statusMessage: string }>('/api/auth/login', { email: DEMO.analyst, password: 'not-the-password' })
    const unknown = await new Client().post<{ statusMessage: string }>('/api/auth/login', { email: 'nobody-here@larkspur.example', password: 'not-the-password' })
    expect(wrong.status).toBe(401)
    expect(unknown.status).toBe(401)
    expect(unknown.body.statusMessage).toBe(wrong.body.statusMessage)
  })

  it('sign-out ends the session on the next request, even if the old cookie is replayed', async () => {
    const client = await signedIn(DEMO.auditor)
    const stolen = client.cookie
    expect((await client.get('/api/me')).status).toBe(200)
    expect((await client.post('/api/auth/logout')).status).toBe(200)
    const replay = new Client()
    replay.cookie = stolen
    expect((await replay.get('/api/me')).status).toBe(401)
  })
})

describe('password change', () => {
  it('needs the current password, then ends every other session', async () => {
    const { client, email, password } = await freshOrg()
    const other = await signedIn(email, password)
    const bad = await client.post('/api/auth/password', { currentPassword: 'wrong-password-123', newPassword: 'a brand new passphrase' })
    expect(bad.status).toBe(400)
    const good = await client.post('/api/auth/password', { currentPassword: password, newPassword: 'a brand new passphrase' })
    expect(good.status).toBe(200)
    expect((await client.get('/api/me')).status).toBe(200)
    expect((await other.get('/api/me')).status).toBe(401)
    await signedIn(email, 'a brand new passphrase')
    expect((await new Client().post('/api/auth/login', { email, password })).status).toBe(401)
  })
})

describe('throttling', () => {
  it('answers 429 after 10 failures in 15 minutes for one account, from any address', async () => {
    const { email, password } = await freshOrg()
    for (let i = 0; i < 10; i++) {
      expect((await new Client().post('/api/auth/login', { email, password: `wrong-${i}` })).status).toBe(401)
    }
    const blocked = await new Client().post('/api/auth/login', { email, password })
    expect(blocked.status).toBe(429)
    expect(Number(blocked.headers.get('retry-after'))).toBeGreaterThan(0)
    // no permanent lockout: once the failures are older than the window, the right password works
    await ownerDb().query(`UPDATE login_failures SET failed_at = now() - interval '16 minutes' WHERE key = :key`, { replacements: { key: `account:${email}` } })
    expect((await new Client().post('/api/auth/login', { email, password })).status).toBe(200)
  })

  it('answers 429 after 10 failures from one address, across accounts, without saying which e-mails exist', async () => {
    const attacker = new Client()
    for (let i = 0; i < 10; i++) {
      expect((await attacker.post('/api/auth/login', { email: uniqueEmail('probe'), password: 'guess-guess' })).status).toBe(401)
    }
    expect((await attacker.post('/api/auth/login', { email: DEMO.analyst, password: 'knotwork-demo-2026' })).status).toBe(429)
    // another address is not affected
    expect((await new Client().post('/api/auth/login', { email: DEMO.analyst, password: 'knotwork-demo-2026' })).status).toBe(200)
  })
})

describe('sign-up with an address already registered', () => {
  it('is refused, makes nothing, and tells the address\'s owner by e-mail', async () => {
    const { email } = await freshOrg()
    const before = await count('SELECT 1 FROM organisations')
    const r = await new Client().post<{ statusMessage: string }>('/api/auth/signup', { name: 'Someone Else', email, password: 'a long enough password', organisation: 'Copycat Ltd' })
    expect(r.status).toBe(409)
    expect(r.body.statusMessage).toMatch(/sign in instead/)
    expect(await count('SELECT 1 FROM organisations')).toBe(before)
    if (INBOX) expect((await waitForMail(email, 'tried to sign up')).text).toContain('no new account was made')
  })

  it('answers 429 after 10 refusals from one address, and lets other addresses sign up', async () => {
    const { email } = await freshOrg()
    const prober = new Client()
    for (let i = 0; i < 10; i++) {
      expect((await prober.post('/api/auth/signup', { name: 'Probe', email, password: 'a long enough password', organisation: 'Probe Co' })).status).toBe(409)
    }
    const blocked = await prober.post('/api/auth/signup', { name: 'Probe', email: uniqueEmail('new'), password: 'a long enough password', organisation: 'Probe Co' })
    expect(blocked.status).toBe(429)
    expect(Number(blocked.headers.get('retry-after'))).toBeGreaterThan(0)
    expect((await new Client().post('/api/auth/signup', { name: 'Fresh', email: uniqueEmail('fresh'), password: 'a long enough password', organisation: `Fresh ${Date.now()}` })).status).toBe(201)
  })
})

describe('organisations are kept apart', () => {
  it('answers 404 for an organisation the caller does not belong to, and for one that does not exist', async () => {
    const client = await signedIn(DEMO.admin)
    const other = await client.get(`/api/orgs/${FENWICK}`)
    const missing = await client.get('/api/orgs/no-such-organisation')
    expect(other.status).toBe(404)
    expect(missing.status).toBe(404)
    expect(other.body).toMatchObject({ statusMessage: (missing.body as { statusMessage: string }).statusMessage })
  })

  it('lets a person in two organisations see both, with their role in each', async () => {
    const client = await signedIn(DEMO.both)
    expect((await client.get(`/api/orgs/${LARKSPUR}`)).status).toBe(200)
    expect((await client.get(`/api/orgs/${FENWICK}`)).status).toBe(200)
  })

  it('answers 403 to a role without the permission', async () => {
    const analyst = await signedIn(DEMO.analyst)
    expect((await analyst.get(`/api/orgs/${LARKSPUR}/members`)).status).toBe(403)
    const admin = await signedIn(DEMO.admin)
    expect((await admin.get(`/api/orgs/${LARKSPUR}/members`)).status).toBe(200)
  })

  it('applies a role removal on the very next request', async () => {
    const { client: admin, orgId, slug } = await freshOrg()
    const email = uniqueEmail('member')
    // a second person, added straight into the database (invitations arrive with the members issue)
    await new Client().post('/api/auth/signup', { name: 'Second', email, password: 'another long password', organisation: `Elsewhere ${Date.now()}` })
    await ownerDb().query(`INSERT INTO memberships (org_id, user_id, role) SELECT :orgId, id, 'analyst' FROM users WHERE email = :email`, { replacements: { orgId, email } })
    const member = await signedIn(email, 'another long password')
    expect((await member.get(`/api/orgs/${slug}/tables`)).status).toBe(200)
    await ownerDb().query('DELETE FROM memberships WHERE org_id = :orgId AND user_id = (SELECT id FROM users WHERE email = :email)', { replacements: { orgId, email } })
    expect((await member.get(`/api/orgs/${slug}/tables`)).status).toBe(404)
    expect((await admin.get(`/api/orgs/${slug}/tables`)).status).toBe(200)
  })
})
