import { ROLE_ONLY, type RouteExpectation } from './types'

// Issue 18: the caller's own uploads and submissions (each person sees only their own; tests/api/my-work.test.ts).
export const myWorkRoutes: Record<string, RouteExpectation> = {
  'GET /api/orgs/[org]/my/uploads': { expect: ROLE_ONLY(['actuary', 'analyst']) },
  'GET /api/orgs/[org]/my/submissions': { expect: ROLE_ONLY(['actuary', 'analyst']) },
}
