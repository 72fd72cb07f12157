import type { Json } from './content'

// A JSON value as rows of (path, type, value), and back. Paths are RFC 6901 JSON Pointers whose
// array positions are written [n] (so a key "0" and a position 0 never look alike); in keys,
// "~" is ~0, "/" is ~1 and "[" is ~2.
export type RowType = 'text' | 'number' | 'true/false' | 'none' | 'empty list' | 'empty record'
export interface JsonRow { path: string; type: RowType; value: string | number | boolean | null }

const escKey = (k: string) => k.replace(/~/g, '~0').replace(/\//g, '~1').replace(/\[/g, '~2')
const unescKey = (k: string) => k.replace(/~2/g, '[').replace(/~1/g, '/').replace(/~0/g, '~')
/** Keys in RFC 8785 order (UTF-16 code units), so the rows do not depend on how an object was built. */
const sortedKeys = (o: Record<string, Json>) => Object.keys(o).sort((a, b) => (a < b ? -1 : a > b ? 1 : 0))

export function toRows(value: Json, path: string, out: JsonRow[] = []): JsonRow[] {
  if (value === null) out.push({ path, type: 'none', value: null })
  else if (typeof value === 'string') out.push({ path, type: 'text', value })
  else if (typeof value === 'number') out.push({ path, type: 'number', value })
  else if (typeof value === 'boolean') out.push({ path, type: 'true/false', value })
  else if (Array.isArray(value)) {
    if (!value.length) out.push({ path, type: 'empty list', value: null })
    value.forEach((v, i) => toRows(v, `${path}[${i}]`, out))
  } else {
    const keys = sortedKeys(value)
    if (!keys.length) out.push({ path, type: 'empty record', value: null })
    for (const k of keys) toRows(value[k]!, `${path}/${escKey(k)}`, out)
  }
  return out
}

type Segment = { key: string } | { index: number }
function parsePath(path: string): Segment[] {
  const segments: Segment[] = []
  const re = /\/((?:[^/[~]|~[012])*)|\[(\d{1,7})\]/y
  let at = 0
  while (at < path.length) {
    re.lastIndex = at
    const m = re.exec(path)
    if (!m) throw new Error(`not a content path: ${path}`)
    segments.push(m[2] !== undefined ? { index: Number(m[2]) } : { key: unescKey(m[1]!) })
    at = re.lastIndex
  }
  return segments
}

function leaf(row: JsonRow): Json {
  switch (row.type) {
    case 'text': return row.value === null ? '' : String(row.value)
    case 'number': if (typeof row.value !== 'number') throw new Error(`${row.path}: not a number`); return row.value
    case 'true/false': if (typeof row.value !== 'boolean') throw new Error(`${row.path}: not true/false`); return row.value
    case 'none': return null
    case 'empty list': return []
    case 'empty record': return {}
  }
}

/** Rebuilds one object from rows (the reverse of toRows on an object). */
export function fromRows(rows: JsonRow[]): Record<string, Json> {
  const root: Record<string, Json> = {}
  for (const row of rows) {
    const segments = parsePath(row.path)
    if (!segments.length || !('key' in segments[0]!)) throw new Error(`not a content path: ${row.path}`)
    let node: Json = root
    segments.forEach((seg, i) => {
      const last = i === segments.length - 1
      const next = segments[i + 1]
      const make = (): Json => (last ? leaf(row) : next && 'index' in next ? [] : {})
      if ('index' in seg) {
        if (!Array.isArray(node)) throw new Error(`${row.path}: a position inside something that is not a list`)
        if (seg.index > node.length) throw new Error(`${row.path}: positions must be consecutive`)
        if (node[seg.index] === undefined || last) node[seg.index] = make()
        node = node[seg.index]!
      } else {
        if (node === null || typeof node !== 'object' || Array.isArray(node)) throw new Error(`${row.path}: a key inside something that is not a record`)
        const record: Record<string, Json> = node
        if (record[seg.key] === undefined || last) record[seg.key] = make()
        node = record[seg.key]!
      }
    })
  }
  return root
}
