import { describe, expect, it } from 'vitest'
import { DEMO, anonymous, appRecovered, person, stack } from './helpers'
import { killPostgres, restartPostgres } from './stack'

// While PostgreSQL cannot be reached, every page and API call answers 503 with Retry-After and a message that says the
// service is briefly unavailable (it used to be a bare 500, sign-in included); when PostgreSQL is back, the app
// recovers by itself, without a restart.

const BRIEFLY = /briefly unavailable/i

describe('PostgreSQL unreachable', () => {
  it('answers 503 on API and pages while it is down, and recovers by itself when it is back', async () => {
    const admin = await person(DEMO.admin)
    const actuary = await person(DEMO.actuary)
    expect((await admin.get('/api/me')).status).toBe(200)
    await killPostgres(stack())
    try {
      const api = [
        await admin.get('/api/me'),
        await admin.get('/api/orgs/larkspur-mutual/tables'),
        await anonymous().post('/api/auth/login', { email: DEMO.admin, password: 'knotwork-demo-2026' }),
        await actuary.post('/api/orgs/larkspur-mutual/tables/00000000-0000-4000-8000-000000000000/versions/1/comments', { body: 'while down' }),
      ]
      for (const r of api) {
        expect(r.status, JSON.stringify(r.body).slice(0, 200)).toBe(503)
        expect((r.body as { data: { code: string } }).data.code).toBe('service-unavailable')
        expect((r.body as { statusMessage: string }).statusMessage).toMatch(BRIEFLY)
        expect(Number(r.headers.get('retry-after'))).toBeGreaterThan(0)
      }
      for (const [client, page] of [[anonymous(), '/signin'], [admin, '/orgs/larkspur-mutual'], [admin, '/']] as const) {
        const r = await client.req<string>('GET', page, undefined, { accept: 'text/html' })
        expect(r.status, page).toBe(503)
        expect(r.headers.get('content-type')).toMatch(/text\/html/)
        expect(r.body).toMatch(BRIEFLY)
        expect(Number(r.headers.get('retry-after'))).toBeGreaterThan(0)
      }
    } finally {
      restartPostgres(stack())
    }
    await appRecovered(admin)
    expect((await anonymous().req('GET', '/signin', undefined, { accept: 'text/html' })).status).toBe(200)
    expect((await anonymous().post('/api/auth/login', { email: DEMO.admin, password: 'knotwork-demo-2026' })).status).toBe(200)
    expect((await admin.get('/api/orgs/larkspur-mutual/tables')).status).toBe(200)
  })
})
