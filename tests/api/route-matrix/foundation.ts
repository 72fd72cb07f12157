import { ALL, EVERY_MEMBER, PUBLIC, ROLE_ONLY, SIGNED_IN, type RouteExpectation } from './types'

// Keys are "METHOD /api/path" exactly as the file lives under server/api.
export const foundationRoutes: Record<string, RouteExpectation> = {
  'POST /api/auth/login': { csrf: 'json', expect: { ...PUBLIC } },
  'POST /api/auth/logout': { csrf: 'json', expect: { ...PUBLIC } },
  'POST /api/auth/signup': { csrf: 'json', expect: { ...PUBLIC } },
  // a link that names nothing: 400 for everyone (the same answer as a used or expired link)
  'GET /api/auth/signup/[token]': { path: () => '/api/auth/signup/AAAAAAAAAAAAAAAAAAAAAA', expect: ALL(400) },
  'POST /api/auth/signup/complete': { csrf: 'json', expect: { ...PUBLIC } },
  'POST /api/auth/password': { csrf: 'json', expect: { ...SIGNED_IN } },
  'GET /api/me': { expect: { ...SIGNED_IN } },
  'GET /api/orgs/[org]': { expect: EVERY_MEMBER },
  'GET /api/orgs/[org]/members': { expect: ROLE_ONLY(['admin']) },
  'GET /api/orgs/[org]/tables': { expect: EVERY_MEMBER },
}
