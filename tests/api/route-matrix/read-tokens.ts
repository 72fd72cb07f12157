import { ALL, ROLE_ONLY, type RouteExpectation } from './types'

// Read tokens (managed by the admin) and the read API for production systems, which takes a bearer token, never a
// session: every signed-in caller without a token gets 401 there.
const NOBODY = '00000000-0000-4000-8000-000000000000'
const ADMIN = ROLE_ONLY(['admin'])

export const readTokenRoutes: Record<string, RouteExpectation> = {
  'GET /api/orgs/[org]/read-tokens': { expect: ADMIN },
  'POST /api/orgs/[org]/read-tokens': { csrf: 'json', expect: ADMIN },
  'DELETE /api/orgs/[org]/read-tokens/[token]': { csrf: 'json', path: ({ org }) => `/api/orgs/${org}/read-tokens/${NOBODY}`, expect: { ...ADMIN, admin: 404 } },
  'GET /api/v1/tables': { expect: ALL(401) },
  'GET /api/v1/tables/[table]': { path: () => `/api/v1/tables/${NOBODY}`, expect: ALL(401) },
}
