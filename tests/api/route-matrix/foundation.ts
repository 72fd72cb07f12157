import { EVERY_MEMBER, PUBLIC, ROLE_ONLY, SIGNED_IN, type RouteExpectation } from './types'

// Keys are "METHOD /api/path" exactly as the file lives under server/api.
export const foundationRoutes: Record<string, RouteExpectation> = {
  'POST /api/auth/login': { expect: { ...PUBLIC } },
  'POST /api/auth/logout': { expect: { ...PUBLIC } },
  'POST /api/auth/signup': { expect: { ...PUBLIC } },
  'POST /api/auth/password': { expect: { ...SIGNED_IN } },
  'GET /api/me': { expect: { ...SIGNED_IN } },
  'GET /api/orgs/[org]': { expect: EVERY_MEMBER },
  'GET /api/orgs/[org]/members': { expect: ROLE_ONLY(['admin']) },
  'GET /api/orgs/[org]/tables': { expect: EVERY_MEMBER },
}
