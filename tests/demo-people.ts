// The invented demo people (scripts/seed), as the API and browser tests sign in. One list for both suites.
export const DEMO_PASSWORD = 'knotwork-demo-2026'
export const DEMO_PEOPLE = {
  admin: 'hazel.okafor@larkspur.example',
  actuary: 'tomas.varga@larkspur.example',
  analyst: 'priya.raman@larkspur.example',
  auditor: 'greta.lind@larkspur.example',
  both: 'felix.amari@fenwickrowe.example',
  otherAdmin: 'oona.pike@fenwickrowe.example',
} as const
export const LARKSPUR = 'larkspur-mutual'
export const FENWICK = 'fenwick-rowe'
