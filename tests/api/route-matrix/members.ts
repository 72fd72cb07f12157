import { ALL, PUBLIC, ROLE_ONLY, type RouteExpectation } from './types'

// Members, invitations and password reset. Ids that name nothing answer 404 even for the admin.
const NOBODY = '00000000-0000-4000-8000-000000000000'
const BOGUS_TOKEN = 'AAAAAAAAAAAAAAAAAAAAAA'
const ADMIN = ROLE_ONLY(['admin'])
const ADMIN_MISSING = { ...ADMIN, admin: 404 }

export const membersRoutes: Record<string, RouteExpectation> = {
  'GET /api/orgs/[org]/seats': { expect: ADMIN },
  'PATCH /api/orgs/[org]/members/[user]': { csrf: 'json', path: ({ org }) => `/api/orgs/${org}/members/${NOBODY}`, expect: ADMIN },
  'DELETE /api/orgs/[org]/members/[user]': { csrf: 'json', path: ({ org }) => `/api/orgs/${org}/members/${NOBODY}`, expect: ADMIN_MISSING },
  'GET /api/orgs/[org]/invitations': { expect: ADMIN },
  'POST /api/orgs/[org]/invitations': { csrf: 'json', expect: ADMIN },
  'DELETE /api/orgs/[org]/invitations/[invitation]': { csrf: 'json', path: ({ org }) => `/api/orgs/${org}/invitations/${NOBODY}`, expect: ADMIN_MISSING },
  'POST /api/orgs/[org]/invitations/[invitation]/resend': { csrf: 'json', path: ({ org }) => `/api/orgs/${org}/invitations/${NOBODY}/resend`, expect: ADMIN_MISSING },
  'GET /api/invitations/[token]': { path: () => `/api/invitations/${BOGUS_TOKEN}`, expect: ALL(404) },
  'POST /api/invitations/[token]/accept': { csrf: 'json', path: () => `/api/invitations/${BOGUS_TOKEN}/accept`, expect: ALL(404) },
  'POST /api/auth/password-reset': { csrf: 'json', expect: { ...PUBLIC } },
  'POST /api/auth/password-reset/confirm': { csrf: 'json', expect: { ...PUBLIC } },
}
