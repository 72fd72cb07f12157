import qs from 'qs'

// eslint-disable-next-line @typescript-eslint/no-explicit-any -- parsed bodies are open JSON, checked field by field
export type Params = Record<string, any>

/** Parses the SDK's `application/x-www-form-urlencoded` bracket bodies (`items[0][price]=...`). */
export function parseForm(raw: string): Params {
  if (!raw) return {}
  return qs.parse(raw, { allowDots: false, depth: 10, arrayLimit: 1000, parameterLimit: 10000 }) as Params
}
