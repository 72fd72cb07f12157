import { afterAll, describe, expect, it } from 'vitest'
import { Client, DEMO, FENWICK, LARKSPUR, closeOwnerDb, count, freshOrg, ownerDb, signedIn, uniqueEmail } from './helpers'
import { mailsTo, tokenIn, waitForMail } from './inbox'

afterAll(closeOwnerDb)

/** Asks to sign up and reads the link from the fake inbox. */
async function signupLink(email: string, client = new Client()): Promise<string> {
  expect((await client.post('/api/auth/signup', { email })).status).toBe(202)
  return tokenIn(await waitForMail(email, 'Finish creating'), '/confirm-signup')
}

/** Fails instead of hanging when a request waits for a table the test holds locked. */
function within<T>(work: Promise<T>, what: string): Promise<T> {
  return Promise.race([work, new Promise<never>((_, reject) => setTimeout(() => reject(new Error(`${what} waited for the locked table`)), 20_000))])
}

describe('sign-up', () => {
  it('asks for the address, mails a link; the link makes the organisation with the person as its admin, signed in', async () => {
    const { client, slug, email } = await freshOrg('Quillmoor Friendly Society')
    expect(slug).toMatch(/^quillmoor-friendly-society/)
    const me = await client.get<{ user: { email: string }; memberships: { role: string; org: { slug: string } }[] }>('/api/me')
    expect(me.status).toBe(200)
    expect(me.body.user.email).toBe(email)
    expect(me.body.memberships).toEqual([expect.objectContaining({ role: 'admin', org: expect.objectContaining({ slug }) })])
    expect(await count(`SELECT 1 FROM audit_events a JOIN organisations o ON o.id = a.org_id WHERE o.slug = :slug AND a.action = 'org.create'`, { slug })).toBe(1)
  })

  it('refuses a short password with a message a person can act on, and the link still works after', async () => {
    const email = uniqueEmail('short')
    const token = await signupLink(email)
    const r = await new Client().post<{ statusMessage: string }>('/api/auth/signup/complete', { token, name: 'A', password: 'short', organisation: 'Short Co' })
    expect(r.status).toBe(400)
    expect(r.body.statusMessage).toContain('at least 12 characters')
    expect((await new Client().get<{ email: string }>(`/api/auth/signup/${token}`)).body.email).toBe(email)
    expect((await new Client().post('/api/auth/signup/complete', { token, name: 'A', password: 'long enough now', organisation: 'Short Co' })).status).toBe(201)
  })

  it('stores the password with scrypt at OWASP cost (N=2^17, r=8, p=1), never in clear', async () => {
    const { email, password } = await freshOrg()
    const [rows] = await ownerDb().query('SELECT password_hash FROM users WHERE email = :email', { replacements: { email } })
    const hash = (rows as { password_hash: string }[])[0]!.password_hash
    expect(hash).toMatch(/^\$scrypt\$ln=17,r=8,p=1\$/)
    expect(hash).not.toContain(password)
  })

  it('a link works once, and not once it has expired; it is stored only as its hash', async () => {
    const token = await signupLink(uniqueEmail('once'))
    expect(await count('SELECT 1 FROM signup_requests WHERE token_hash = encode(sha256(convert_to(:t, \'UTF8\')), \'hex\')', { t: token })).toBe(1)
    expect(await count('SELECT 1 FROM signup_requests WHERE token_hash = :t', { t: token })).toBe(0)
    const details = { name: 'Once', password: 'a long enough password', organisation: `Once ${Date.now()}` }
    expect((await new Client().post('/api/auth/signup/complete', { token, ...details })).status).toBe(201)
    const again = await new Client().post('/api/auth/signup/complete', { token, ...details })
    expect(again.status).toBe(400)
    expect(again.body).toMatchObject({ data: { code: 'link-expired' } })
    const late = await signupLink(uniqueEmail('late'))
    await ownerDb().query(`UPDATE signup_requests SET expires_at = now() - interval '1 second' WHERE token_hash = encode(sha256(convert_to(:t, 'UTF8')), 'hex')`, { replacements: { t: late } })
    expect((await new Client().post('/api/auth/signup/complete', { token: late, ...details, organisation: `Late ${Date.now()}` })).status).toBe(400)
  })
})

describe('sign-up does not reveal whether an address is registered', () => {
  it('answers a registered address exactly as a new one, makes nothing, and tells the owner by e-mail', async () => {
    const { email: registered } = await freshOrg()
    const fresh = uniqueEmail('new')
    const before = await count('SELECT 1 FROM organisations')
    const linksBefore = (await mailsTo(registered)).filter(m => m.subject.includes('Finish creating')).length // its own sign-up
    const a = await new Client().post('/api/auth/signup', { email: registered })
    const b = await new Client().post('/api/auth/signup', { email: fresh })
    expect(a.status).toBe(202)
    expect(b.status).toBe(202)
    expect(a.body).toEqual(b.body)
    const names = (r: typeof a) => {
      const all: string[] = []
      r.headers.forEach((_, name) => { if (!['date', 'x-request-id'].includes(name)) all.push(name) })
      return all.sort()
    }
    expect(names(a)).toEqual(names(b))
    expect((await waitForMail(registered, 'tried to sign up')).text).toContain('no new account was made')
    await waitForMail(fresh, 'Finish creating')
    expect((await mailsTo(registered)).filter(m => m.subject.includes('Finish creating'))).toHaveLength(linksBefore)
    expect(await count('SELECT 1 FROM organisations')).toBe(before)
  })

  it('decides nothing about the address before answering: both answer while the users table is locked', async () => {
    const { email: registered } = await freshOrg()
    const fresh = uniqueEmail('locked')
    const t = await ownerDb().transaction()
    try {
      await ownerDb().query('LOCK TABLE users IN ACCESS EXCLUSIVE MODE', { transaction: t })
      const [a, b] = await within(Promise.all([new Client().post('/api/auth/signup', { email: registered }), new Client().post('/api/auth/signup', { email: fresh })]), 'a sign-up answer')
      expect([a.status, b.status]).toEqual([202, 202])
      expect(a.body).toEqual(b.body)
    } finally {
      await t.rollback()
    }
    await waitForMail(registered, 'tried to sign up')
    await waitForMail(fresh, 'Finish creating')
  })

  it('a link for an address registered in the meantime tells its holder (the mailbox\u2019s owner) to sign in', async () => {
    const email = uniqueEmail('race')
    const first = await signupLink(email)
    const second = await signupLink(email)
    const details = { name: 'Race', password: 'a long enough password' }
    expect((await new Client().post('/api/auth/signup/complete', { token: first, ...details, organisation: `Race A ${Date.now()}` })).status).toBe(201)
    // completing one link spends the others for the same address
    expect((await new Client().post('/api/auth/signup/complete', { token: second, ...details, organisation: `Race B ${Date.now()}` })).status).toBe(400)
  })

  it('sign-up requests are throttled per client address (10 in 15 minutes) and per address asked about', async () => {
    const prober = new Client()
    for (let i = 0; i < 10; i++) expect((await prober.post('/api/auth/signup', { email: uniqueEmail('probe') })).status).toBe(202)
    const blocked = await prober.post('/api/auth/signup', { email: uniqueEmail('probe') })
    expect(blocked.status).toBe(429)
    expect(blocked.body).toMatchObject({ data: { code: 'rate-limited' } })
    expect(Number(blocked.headers.get('retry-after'))).toBeGreaterThan(0)
    expect((await new Client().post('/api/auth/signup', { email: uniqueEmail('fresh') })).status).toBe(202)
    const target = uniqueEmail('target')
    for (let i = 0; i < 5; i++) expect((await new Client().post('/api/auth/signup', { email: target })).status).toBe(202)
    expect((await new Client().post('/api/auth/signup', { email: target })).status).toBe(429)
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

const failedSignIns = (email: string, outcome: 'failed' | 'denied') =>
  count(`SELECT 1 FROM audit_events WHERE action = 'auth.sign-in' AND outcome = :outcome AND detail->>'email' = :email`, { email, outcome })
const heldAttempts = async (key: string) => {
  const [rows] = await ownerDb().query('SELECT cardinality(attempts) AS n FROM auth_throttles WHERE key = :key', { replacements: { key } })
  return Number((rows as { n: number }[])[0]?.n ?? 0)
}

describe('throttles that hold under concurrency', () => {
  it('40 simultaneous wrong passwords for one account: 10 are evaluated, 30 refused before hashing; a colleague behind the same address signs in', async () => {
    const victim = await freshOrg()
    const colleague = await freshOrg()
    const office = new Client().address
    const answers = await Promise.all(Array.from({ length: 40 }, (_, i) =>
      new Client(office).post('/api/auth/login', { email: victim.email, password: `wrong guess ${i}` })))
    const statuses = answers.map(r => r.status).sort()
    expect(statuses.filter(s => s === 401)).toHaveLength(10)
    expect(statuses.filter(s => s === 429)).toHaveLength(30)
    // a failure is written only after the hash said no: exactly 10 hashes ran, 30 refusals never reached one
    expect(await failedSignIns(victim.email, 'failed')).toBe(10)
    expect(await failedSignIns(victim.email, 'denied')).toBe(30)
    expect(await heldAttempts(`account:${victim.email}`)).toBe(10)
    // the office's address is far from its own, higher limit: the colleague's right password works
    expect((await new Client(office).post('/api/auth/login', { email: colleague.email, password: colleague.password })).status).toBe(200)
    // the locked account refuses even its right password, from any address, until the window passes
    const locked = await new Client().post('/api/auth/login', { email: victim.email, password: victim.password })
    expect(locked.status).toBe(429)
    expect(Number(locked.headers.get('retry-after'))).toBeGreaterThan(0)
    await ownerDb().query(`UPDATE auth_throttles SET attempts = ARRAY(SELECT a - interval '16 minutes' FROM unnest(attempts) a) WHERE key = :key`, { replacements: { key: `account:${victim.email}` } })
    expect((await new Client().post('/api/auth/login', { email: victim.email, password: victim.password })).status).toBe(200)
  })

  it('one address: 429 after 100 failed password checks across accounts, the same for registered and unknown e-mails', async () => {
    const prober = new Client()
    // 99 failures already in the window (written behind the app's back; 99 real hashes would take minutes)
    await ownerDb().query(`INSERT INTO auth_throttles (key, attempts) VALUES (:key, ARRAY(SELECT now() - g * interval '1 second' FROM generate_series(1, 99) g))`, { replacements: { key: `address:${prober.address}` } })
    expect((await prober.post('/api/auth/login', { email: uniqueEmail('probe'), password: 'guess-guess' })).status).toBe(401)
    expect((await prober.post('/api/auth/login', { email: uniqueEmail('probe'), password: 'guess-guess' })).status).toBe(429)
    expect((await prober.post('/api/auth/login', { email: DEMO.analyst, password: 'knotwork-demo-2026' })).status).toBe(429)
    expect((await new Client().post('/api/auth/login', { email: DEMO.analyst, password: 'knotwork-demo-2026' })).status).toBe(200)
  })

  it('wrong current passwords on password change count against the account like sign-ins: 15 at once, 10 evaluated', async () => {
    const { client, email, password } = await freshOrg()
    const answers = await Promise.all(Array.from({ length: 15 }, (_, i) =>
      client.post('/api/auth/password', { currentPassword: `wrong current ${i}`, newPassword: 'a brand new passphrase' })))
    expect(answers.filter(r => r.status === 400)).toHaveLength(10)
    expect(answers.filter(r => r.status === 429)).toHaveLength(5)
    expect(await count(`SELECT 1 FROM audit_events WHERE action = 'auth.password-change' AND outcome = 'failed' AND actor_email = :email`, { email })).toBe(10)
    expect((await client.post('/api/auth/password', { currentPassword: password, newPassword: 'a brand new passphrase' })).status).toBe(429)
    expect((await new Client().post('/api/auth/login', { email, password })).status).toBe(429)
  })

  it('a right password gives its slot back: sign-ins that succeed never lock an account', async () => {
    const { email, password } = await freshOrg()
    for (let i = 0; i < 12; i++) expect((await new Client().post('/api/auth/login', { email, password })).status).toBe(200)
    expect(await heldAttempts(`account:${email}`)).toBe(0)
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

  it('applies a membership removal on the very next request', async () => {
    const { client: admin, orgId, slug } = await freshOrg()
    const second = await freshOrg()
    // the second person joins behind the app's back (invitations are tested in members.test.ts)
    await ownerDb().query(`INSERT INTO memberships (org_id, user_id, role) SELECT :orgId, id, 'analyst' FROM users WHERE email = :email`, { replacements: { orgId, email: second.email } })
    expect((await second.client.get(`/api/orgs/${slug}/tables`)).status).toBe(200)
    await ownerDb().query('DELETE FROM memberships WHERE org_id = :orgId AND user_id = (SELECT id FROM users WHERE email = :email)', { replacements: { orgId, email: second.email } })
    expect((await second.client.get(`/api/orgs/${slug}/tables`)).status).toBe(404)
    expect((await admin.get(`/api/orgs/${slug}/tables`)).status).toBe(200)
  })
})
