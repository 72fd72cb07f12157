import { describe, expect, it } from 'vitest'
import { BODY_LIMITS, bodyRuleFor, formatBytes, isJsonContentType } from '~~/server/lib/request-body-rules'

// Which limit and content type each address takes (server/middleware/request-body.ts applies them).
describe('request body rules', () => {
  it('JSON routes take JSON up to 256 KiB unless named', () => {
    expect(bodyRuleFor('POST', '/api/auth/login')).toEqual({ limit: 256 * 1024, json: true })
    expect(bodyRuleFor('PATCH', '/api/orgs/larkspur-mutual/tables/x?y=1')).toEqual({ limit: BODY_LIMITS.default, json: true })
    expect(bodyRuleFor('POST', '/api/nope')).toEqual({ limit: BODY_LIMITS.default, json: true })
  })
  it('pages take no JSON rule but the same byte limit', () => {
    expect(bodyRuleFor('POST', '/signin')).toEqual({ limit: BODY_LIMITS.default, json: false })
    expect(bodyRuleFor('POST', '/apiary')).toEqual({ limit: BODY_LIMITS.default, json: false })
  })
  it('named routes get their own limits; the two multipart uploads are left to their own counted readers', () => {
    expect(bodyRuleFor('PUT', '/api/orgs/o/tables/t/versions/2/points')).toEqual({ limit: 4 * 1024 * 1024, json: true })
    expect(bodyRuleFor('POST', '/api/orgs/o/imports/i/preview')).toEqual({ limit: 1024 * 1024, json: true })
    expect(bodyRuleFor('POST', '/api/orgs/o/imports/i/commit')).toEqual({ limit: 1024 * 1024, json: true })
    expect(bodyRuleFor('POST', '/api/webhooks/stripe')).toEqual({ limit: 1024 * 1024, json: true })
    expect(bodyRuleFor('POST', '/api/orgs/o/imports')).toEqual({ limit: null, json: false })
    expect(bodyRuleFor('POST', '/api/orgs/o/exports/verify')).toEqual({ limit: null, json: false })
  })
  it('the exemption is for the upload method and address only', () => {
    expect(bodyRuleFor('PUT', '/api/orgs/o/imports')).toEqual({ limit: BODY_LIMITS.default, json: true })
    expect(bodyRuleFor('POST', '/api/orgs/o/imports/x')).toEqual({ limit: BODY_LIMITS.default, json: true })
    expect(bodyRuleFor('POST', '/api/orgs/o/p/imports')).toEqual({ limit: BODY_LIMITS.default, json: true })
  })
  it('knows JSON content types', () => {
    for (const t of ['application/json', 'application/json; charset=utf-8', 'Application/JSON;charset=UTF-8']) expect(isJsonContentType(t), t).toBe(true)
    for (const t of [undefined, '', 'text/plain', 'application/jsonp', 'application/x-www-form-urlencoded', 'multipart/form-data; boundary=x', 'text/json']) expect(isJsonContentType(t), String(t)).toBe(false)
  })
  it('writes limits as people read them', () => {
    expect(formatBytes(256 * 1024)).toBe('256 KiB')
    expect(formatBytes(4 * 1024 * 1024)).toBe('4 MiB')
    expect(formatBytes(1536 * 1024)).toBe('1.5 MiB')
  })
})
