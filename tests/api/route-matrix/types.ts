// One expectation per route and caller. 'pass' means the caller got past authentication and
// authorisation (any status but 401, 403 and 404): validation errors on an empty body count as pass.
export type Expect = number | 'pass'
export type Caller = 'anonymous' | 'admin' | 'actuary' | 'analyst' | 'auditor' | 'otherOrg'
/**
 * How a change is protected from cross-site forgery (server/middleware/01.same-origin.ts; tests/api/csrf.test.ts).
 * json: only from the app's own origin, and a body must be JSON (a form body answers 403 json-required).
 * multipart: only from the app's own origin; the body is a multipart upload.
 * exempt: proves itself another way (Stripe's signature); any origin may call it.
 */
export type CsrfRule = 'json' | 'multipart' | 'exempt'

export interface RouteExpectation {
  /** Concrete path to call; [org] becomes the Larkspur slug (or Fenwick & Rowe's for otherOrg callers of non-org routes). */
  path?: (ctx: MatrixContext) => string | Promise<string>
  body?: unknown
  expect: Record<Caller, Expect>
  /** required for every POST, PUT, PATCH and DELETE route */
  csrf?: CsrfRule
}

export interface MatrixContext {
  org: string
  /** ids of demo objects in Larkspur, looked up once (features add what they need) */
  ids: Record<string, string>
}

export const ROLE_ONLY = (allowed: Caller[]): Record<Caller, Expect> => ({
  anonymous: 401,
  admin: allowed.includes('admin') ? 'pass' : 403,
  actuary: allowed.includes('actuary') ? 'pass' : 403,
  analyst: allowed.includes('analyst') ? 'pass' : 403,
  auditor: allowed.includes('auditor') ? 'pass' : 403,
  otherOrg: 404,
})

export const EVERY_MEMBER = ROLE_ONLY(['admin', 'actuary', 'analyst', 'auditor'])
export const SIGNED_IN = { anonymous: 401, admin: 'pass', actuary: 'pass', analyst: 'pass', auditor: 'pass', otherOrg: 'pass' } as Record<Caller, Expect>
export const PUBLIC = { anonymous: 'pass', admin: 'pass', actuary: 'pass', analyst: 'pass', auditor: 'pass', otherOrg: 'pass' } as Record<Caller, Expect>
/** The same status for every caller. */
export const ALL = (status: Expect) => Object.fromEntries(['anonymous', 'admin', 'actuary', 'analyst', 'auditor', 'otherOrg'].map(c => [c, status])) as Record<Caller, Expect>
