import { invalid } from './errors.ts'
import type { Params } from './form.ts'

/** Stripe answers 400 for parameters it does not know; so does the fake for those it does not implement. */
export function allowOnly(p: Params, allowed: string[]): void {
  for (const key of Object.keys(p)) {
    if (key === 'expand' || allowed.includes(key)) continue
    throw invalid(`Received unknown parameter: ${key} (the local Stripe fake accepts: ${allowed.join(', ') || 'none'})`, key)
  }
}

export function optString(p: Params, key: string, param = key): string | undefined {
  const v = p[key]
  if (v === undefined) return undefined
  if (typeof v !== 'string') throw invalid(`Invalid string: ${JSON.stringify(v)}`, param)
  return v
}

export function reqString(p: Params, key: string, param = key): string {
  const v = optString(p, key, param)
  if (v === undefined || v === '') throw invalid(`Missing required param: ${param}.`, param, 'parameter_missing')
  return v
}

/** Empty string unsets a field, as in Stripe's form API. */
export function optNullableString(p: Params, key: string, param = key): string | null | undefined {
  const v = optString(p, key, param)
  return v === '' ? null : v
}

export function optInt(p: Params, key: string, param = key, min = Number.MIN_SAFE_INTEGER): number | undefined {
  const v = p[key]
  if (v === undefined) return undefined
  if (typeof v !== 'string' || !/^-?\d+$/.test(v)) throw invalid(`Invalid integer: ${String(v)}`, param)
  const n = Number(v)
  if (!Number.isSafeInteger(n) || n < min) throw invalid(`Invalid integer: ${v} (must be >= ${min})`, param)
  return n
}

export function optBool(p: Params, key: string, param = key): boolean | undefined {
  const v = p[key]
  if (v === undefined) return undefined
  if (v === 'true') return true
  if (v === 'false') return false
  throw invalid(`Invalid boolean: ${String(v)}`, param)
}

export function optEnum<T extends string>(p: Params, key: string, values: readonly T[], param = key): T | undefined {
  const v = optString(p, key, param)
  if (v === undefined) return undefined
  if (!values.includes(v as T)) throw invalid(`Invalid ${param}: must be one of ${values.join(', ')}`, param)
  return v as T
}

/** qs gives arrays for `a[0]`, objects for sparse or large indices: accept both. */
export function listParam(v: unknown, param: string): Params[] {
  if (v === undefined || v === '') return []
  if (Array.isArray(v)) return v
  if (typeof v === 'object' && v !== null) return Object.values(v)
  throw invalid(`Invalid array`, param)
}

export function optObject(p: Params, key: string, param = key): Params | undefined {
  const v = p[key]
  if (v === undefined || v === '') return undefined
  if (typeof v !== 'object' || v === null || Array.isArray(v)) throw invalid(`Invalid object`, param)
  return v as Params
}

/** Metadata update: keys merge, `key=''` removes one key, `metadata=''` clears all (Stripe's rules). */
export function applyMetadata(current: Record<string, string>, update: unknown): Record<string, string> {
  if (update === undefined) return current
  if (update === '') return {}
  if (typeof update !== 'object' || update === null || Array.isArray(update)) throw invalid('Invalid object', 'metadata')
  const next = { ...current }
  for (const [k, v] of Object.entries(update as Record<string, unknown>)) {
    if (typeof v !== 'string') throw invalid(`Invalid metadata value for ${k}`, `metadata[${k}]`)
    if (k.length > 40) throw invalid('Metadata keys can be at most 40 characters.', `metadata[${k}]`)
    if (v.length > 500) throw invalid('Metadata values can be at most 500 characters.', `metadata[${k}]`)
    if (v === '') delete next[k]
    else next[k] = v
  }
  if (Object.keys(next).length > 50) throw invalid('Metadata can have at most 50 keys.', 'metadata')
  return next
}

export function expandParam(p: Params): string[] {
  return listParam(p.expand, 'expand').map(String)
}
