import { ROLE_ONLY, type Caller, type Expect, type RouteExpectation } from './types'

const ADMIN = ROLE_ONLY(['admin'])
const everyone = (status: Expect) => Object.fromEntries(['anonymous', 'admin', 'actuary', 'analyst', 'auditor', 'otherOrg'].map(c => [c, status])) as Record<Caller, Expect>

export const billingRoutes: Record<string, RouteExpectation> = {
  'GET /api/orgs/[org]/billing': { expect: ADMIN },
  'POST /api/orgs/[org]/billing/seats': { csrf: 'json', expect: ADMIN },
  'POST /api/orgs/[org]/billing/seats-preview': { csrf: 'json', expect: ADMIN },
  'GET /api/orgs/[org]/billing/status': { expect: ADMIN },
  // Stripe's webhook: no session; an unsigned body is refused with 400 whoever sends it
  'POST /api/webhooks/stripe': { csrf: 'exempt', expect: everyone(400) },
}
