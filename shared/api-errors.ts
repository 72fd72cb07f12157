// Machine-readable error codes. Every 4xx (and the 5xx a person can act on) carries one in `data.code`; the client
// decides on these codes, never on the message text, which is for people and may change.
export const API_ERROR_CODES = [
  // input
  'invalid-input', // a field or parameter failed validation (data.issues lists every problem)
  'invalid-json', // the body is not JSON
  'unsupported-media-type', // 415: a JSON route was sent another content type
  'body-too-large', // 413: the request body passed its route's limit (counted as the bytes arrive)
  'engine-refused', // the engine refused the request (data.engineCode names the engine's reason)
  'import-refused', // an uploaded file was refused (kind, size, structure)
  'import-blocked', // the upload's values have blocking findings (data.findings)
  'import-warnings', // warnings must be accepted first (data.findings)
  'not-graduated-kind', // graduation is for rates from experience (mortality, lapse, salary), not curves
  'graduation-out-of-range', // a graduated value breaks the table's range rule (q below 0, say): not made a draft
  // who is asking
  'sign-in-required',
  'session-ended',
  'wrong-credentials',
  'wrong-password',
  'read-token-required',
  'cross-origin', // a change that did not come from one of the app's own pages (Origin / Sec-Fetch-Site)
  'json-required', // a JSON route was sent a form body (a type a cross-site page can send without asking)
  'role-forbidden',
  'own-work', // maker-checker: nobody signs off their own work
  'not-found', // missing, or another organisation's (the same answer on purpose); also an unknown /api/ address
  'method-not-allowed', // 405: a known /api/ address asked with a method it does not serve
  'link-expired',
  // state
  'draft-conflict', // someone saved the draft after it was read (data.lockVersion is the current one)
  'not-a-draft', // only a working draft changes
  'version-open', // a draft or a version in review already exists
  'fill-missing', // no fill is recorded
  'fill-stale', // the recorded fill was fitted on other points than the version holds (choose it again)
  'wrong-state', // the version is not in the state the action needs
  'wrong-shape', // a one-way action on a two-way table or the other way round (issue 17)
  'meaning-fixed', // kind, axis and units are fixed once a version left draft
  'name-taken',
  'already-member',
  'invitation-open',
  'last-admin',
  'seats-full',
  'seats-in-use',
  'not-signed-off',
  'reload-needed',
  // limits and services
  'rate-limited', // 429 with Retry-After
  'payment-refused',
  'service-unreachable',
  'not-configured',
  'mail-failed',
  'cancelled', // the run was cancelled (by its owner, or its connection closed)
  'run-unfinished', // the run has no result yet (data.status says where it is)
  'try-later',
  'service-unavailable', // 503: the database cannot be reached just now (Retry-After); the app recovers by itself
] as const
export type ApiErrorCode = (typeof API_ERROR_CODES)[number]
