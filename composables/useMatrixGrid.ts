import { fromPerUnit, parseNumberText, toPerUnit } from '#shared/decimal-text'
import { saveCellsSchema } from '#shared/schemas/two-way'
import type { ValueUnit } from '#shared/tables'
import type { CellDto, VersionDto } from '#shared/types/tables'
import { readPastedMatrix, readTypedNumber } from '~/utils/paste-block'

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
  const history = useUndoHistory(values, v => ({ ...v }))
  /** The version loaded and its cells as last loaded or saved: what "unsaved edits" compares. */
  const loaded = ref<{ id: string, text: string } | null>(null)
  const valuesText = (v: Record<string, string>) => Object.keys(v).filter(k => v[k]?.trim()).sort().map(k => `${k}=${v[k]!.trim()}`).join('\n')
  const dirty = computed(() => loaded.value !== null && valuesText(values.value) !== loaded.value.text)
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
    loaded.value = { id: v.id, text: valuesText(values.value) }
    history.reset()
  }
  /** The answer of our own save (its lock is ours already): the matrix stays as it is. */
  const isOwnSave = (v: VersionDto) => v.id === loaded.value?.id && v.lockVersion === lockVersion.value
  function cells(): CellDto[] {
    const out: CellDto[] = []
    for (const x of rows.value) {
      for (const d of cols.value) {
        const text = values.value[key(x, d)]?.trim()
        if (!text) continue
        const p = parseNumberText(readTypedNumber(text).text)
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
    const text = valuesText(values.value)
    const answer = await putUnderLock(api, `${url.value}/cells`, body, { lockVersion, conflict, failure, saved, saving })
    if (!answer || !loaded.value) return answer
    // nothing typed meanwhile: the cells read as stored ('0,6' becomes 0.6); undo steps stay
    const unchanged = valuesText(values.value) === text
    if (unchanged) values.value = Object.fromEntries(answer.cells.map(c => [key(c.x, c.d), fromPerUnit(c.y, unit.value)]))
    loaded.value = { id: answer.id, text: unchanged ? valuesText(values.value) : text }
    return answer
  }
  /** A block copied from a spreadsheet (tab-separated lines), written from cell (r, c) right and down: one undo step. */
  function paste(r: number, c: number, text: string): { text: string, error: boolean } {
    const read = readPastedMatrix(text)
    if (!read.ok) return { text: read.message, error: true }
    history.record()
    let n = 0
    read.lines.forEach((line, i) => line.forEach((v, j) => {
      const x = rows.value[r + i]
      const d = cols.value[c + j]
      if (x === undefined || d === undefined) return
      values.value[key(x, d)] = v
      n += 1
    }))
    return { text: `Pasted ${n} cells${read.decimalComma ? '; decimal commas read as points' : ''}.`, error: false }
  }
  return { rows, cols, values, key, history, dirty, lockVersion, failure, saved, saving, conflict, load, isOwnSave, save, paste }
}
