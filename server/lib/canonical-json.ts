// RFC 8785 (JSON Canonicalization Scheme) for the values we sign and chain:
// object keys sorted by UTF-16 code units, no whitespace, ECMAScript number
// serialisation (JSON.stringify is exactly that for finite numbers), strings as JSON.stringify.
export function canonicalJson(value: unknown): string {
  if (value === null || typeof value === 'boolean') return JSON.stringify(value)
  if (typeof value === 'number') {
    if (!Number.isFinite(value)) throw new TypeError('RFC 8785: non-finite numbers cannot be canonicalised')
    return JSON.stringify(value)
  }
  if (typeof value === 'string') return JSON.stringify(value)
  if (Array.isArray(value)) return `[${value.map(canonicalJson).join(',')}]`
  if (value instanceof Date) return JSON.stringify(value.toISOString())
  if (typeof value === 'object') {
    const entries = Object.entries(value as Record<string, unknown>).filter(([, v]) => v !== undefined)
    entries.sort(([a], [b]) => (a < b ? -1 : a > b ? 1 : 0))
    return `{${entries.map(([k, v]) => `${JSON.stringify(k)}:${canonicalJson(v)}`).join(',')}}`
  }
  throw new TypeError(`cannot canonicalise a ${typeof value}`)
}
