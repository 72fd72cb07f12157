import fc from 'fast-check'
import { generateSigningKey, keyIdOf, signBytes, canonicalBytes, signHead, HEAD_FORMAT, SIGNED_FORMAT, type Pair, type SignedContent, type SignedContentV2, type SignedHead } from '~~/server/lib/signing'
import { createPrivateKey } from 'node:crypto'

/** One organisation key for a test run. */
export function testKey() {
  const { x, privatePkcs8 } = generateSigningKey()
  return { x, kid: keyIdOf(x), privateKey: createPrivateKey({ key: privatePkcs8, format: 'der', type: 'pkcs8' }) }
}

const decimal = fc.tuple(fc.integer({ min: -999_999, max: 999_999 }), fc.integer({ min: 0, max: 12 }))
  .map(([n, scale]) => {
    const s = Math.abs(n).toString().padStart(scale + 1, '0')
    const text = scale ? `${s.slice(0, -scale)}.${s.slice(-scale)}`.replace(/0+$/, '').replace(/\.$/, '') : s
    return text === '0' ? '0' : `${n < 0 ? '-' : ''}${text}`
  })

/** Points with distinct, increasing x. */
const pairs = (min: number, max: number) => fc.uniqueArray(fc.integer({ min: 0, max: 600 }), { minLength: min, maxLength: max })
  .chain(xs => fc.tuple(fc.constant(xs.sort((a, b) => a - b)), fc.array(decimal, { minLength: xs.length, maxLength: xs.length })))
  .map(([xs, ys]): Pair[] => xs.map((x, i) => [String(x), ys[i]!]))

const person = fc.record({ name: fc.string({ minLength: 1, maxLength: 20 }), email: fc.constantFrom('a@x.example', 'b@y.example') })
/** Text that may start with =, +, - or @ (formula injection) or an apostrophe. */
const risky = fc.oneof(fc.string({ maxLength: 30 }), fc.constantFrom('=1+1', '+SUM(A1)', '-2', '@cmd', '\'quoted', '=HYPERLINK("x")'))

export const arbitraryContent = (kid: string) => fc.record({
  points: pairs(2, 12),
  values: pairs(1, 40),
  name: risky.filter(s => s.length > 0),
  rationale: risky,
  person,
  hasFill: fc.boolean(),
  precision: fc.integer({ min: 10, max: 60 }),
  options: fc.dictionary(fc.constantFrom('bc', '0', 'slope/left', 'a~b', 'k[1]'), fc.oneof(risky, fc.integer(), fc.boolean(), fc.constant(null))),
  units: fc.constantFrom({ kind: 'mortality', valueUnit: 'per-mille', axis: 'age' }, { kind: 'lapse', valueUnit: 'percent', axis: 'policy-year' }, { kind: 'spot-rate', valueUnit: 'basis-points', axis: 'term' }, { kind: 'salary', valueUnit: 'per-unit', axis: 'age' }),
}).map(({ points, values, name, rationale, person, hasFill, precision, options, units: { kind, valueUnit, axis } }): SignedContentV2 => ({
  format: SIGNED_FORMAT,
  organisation: { slug: 'test-org', name: 'Test Org' },
  table: { id: '00000000-0000-4000-8000-000000000001', name, kind, axis, axisUnit: 'years', valueUnit },
  version: { id: '00000000-0000-4000-8000-000000000002', number: 3, status: 'approved', contentHash: 'ab'.repeat(32), notes: '' },
  points,
  fill: hasFill
    ? { spec: { method: 'cubic-natural', options, precision, grid: { from: '0', to: '120', step: '1' }, at: null, money: { ages: [65], interest: '0.03' } }, rationale, checks: { knotsReproduced: true, notes: [], curvature: { count: 2, at: [{ from: '60', to: '65' }] } }, money: { figures: [{ key: 'e65', value: '17.5', label: 'e_65' }] }, filledBy: person, filledAt: '2026-10-01T10:00:00.000Z', values, fittedOn: { contentHash: 'ab'.repeat(32), lockVersion: 4 } }
    : null,
  madeBy: person,
  submittedBy: person,
  submittedAt: '2026-10-01T11:00:00.000Z',
  approvedBy: { name: 'Checker', email: 'c@x.example' },
  approvedAt: '2026-10-02T09:30:00.000Z',
  signedAt: '2026-10-03T08:00:00.000Z',
  keyId: kid,
}))

export function signatureOf(content: SignedContent, key: ReturnType<typeof testKey>) {
  return { signature: signBytes(canonicalBytes(content), key.privateKey), keyId: key.kid, x: key.x }
}

/** A signed audit-trail head of the test organisation. */
export function headOf(key: ReturnType<typeof testKey>, number = 41): SignedHead {
  return signHead({ format: HEAD_FORMAT, organisation: { slug: 'test-org', name: 'Test Org' }, head: { number, eventId: '9041', hash: 'cd'.repeat(32), at: '2026-10-03T07:59:00.000Z' }, statedAt: '2026-10-03T08:00:00.000Z', reason: 'export', keyId: key.kid }, key.privateKey)
}
