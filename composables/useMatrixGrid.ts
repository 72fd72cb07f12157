import { fromPerUnit, parseNumberText, toPerUnit } from '#shared/decimal-text'
import { saveCellsSchema } from '#shared/schemas/two-way'
import type { ValueUnit } from '#shared/tables'
import type { CellDto, VersionDto } from '#shared/types/tables'

/** Row and column values of the matrix: every whole step between the given ones (blank cells are "to fill"). */
function axisValues(given: string[]): string[] {
  const nums = [...new Set(given)].map(Number).sort((a, b) => a - b)
  if (nums.length && nums.every(Number.isInteger) && nums.at(-1)! - nums[0]! <= 200) {
    return Array.from({ length: nums.at(-1)! - nums[0]! + 1 }, (_, i) => String(nums[0]! + i))
  }
  return [...new Set(given)].sort((a, b) => Number(a) - Number(b))
}

/** A two-way draft as a matrix of display text (in the table's unit), saved as cells under its optimistic lock. */
export function useMatrixGrid(url: Ref<string>, unit: Ref<ValueUnit>) {
  const api = useApi()
  const rows = ref<string[]>([])
  const cols = ref<(string | null)[]>([])
  const values = ref<Record<string, string>>({})
  const lockVersion = ref(0)
  const failure = ref<string | null>(null)
  const saved = ref<string | null>(null)
  const saving = ref(false)
  const conflict = ref(false)
  const key = (x: string, d: string | null) => `${x}|${d ?? 'ult'}`

  function load(v: VersionDto, hasUltimate: boolean) {
    rows.value = axisValues(v.cells.map(c => c.x))
    cols.value = [...axisValues(v.cells.filter(c => c.d !== null).map(c => c.d!)), ...(hasUltimate ? [null] : [])]
    values.value = Object.fromEntries(v.cells.map(c => [key(c.x, c.d), fromPerUnit(c.y, unit.value)]))
    lockVersion.value = v.lockVersion
    conflict.value = false
  }
  function cells(): CellDto[] {
    const out: CellDto[] = []
    for (const x of rows.value) {
      for (const d of cols.value) {
        const text = values.value[key(x, d)]?.trim()
        if (!text) continue
        const p = parseNumberText(text)
        if (!p.ok) throw new Error(`Row ${x}, ${d ?? 'ultimate'}: '${text}' ${p.reason}`)
        out.push({ x, d, y: toPerUnit(p, unit.value) })
      }
    }
    return out
  }
  async function save(): Promise<VersionDto | null> {
    failure.value = saved.value = null
    let body
    try { body = { lockVersion: lockVersion.value, cells: cells() } } catch (e) { failure.value = (e as Error).message; return null }
    const check = saveCellsSchema.safeParse(body)
    if (!check.success) { failure.value = check.error.issues[0]!.message; return null }
    return putUnderLock(api, `${url.value}/cells`, body, { lockVersion, conflict, failure, saved, saving })
  }
  /** A block copied from a spreadsheet (tab-separated lines), written from cell (r, c) right and down. */
  function paste(r: number, c: number, text: string): string {
    const lines = text.replace(/\r/g, '').split('\n').filter((l, i, all) => l !== '' || i < all.length - 1)
    let n = 0
    lines.forEach((line, i) => line.split('\t').forEach((v, j) => {
      const x = rows.value[r + i]
      const d = cols.value[c + j]
      if (x === undefined || d === undefined) return
      values.value[key(x, d)] = v.trim()
      n += 1
    }))
    return `Pasted ${n} cells.`
  }
  return { rows, cols, values, key, lockVersion, failure, saved, saving, conflict, load, save, paste }
}
