import { fromPerUnit, parseNumberText, toPerUnit } from '#shared/decimal-text'
import { savePointsSchema } from '#shared/schemas/tables'
import type { ValueUnit } from '#shared/tables'
import type { VersionDto } from '#shared/types/tables'
import type { GridRow } from './usePointsGrid'

/** The rows that hold something, as one text: what "unsaved edits" compares. */
const rowsText = (rows: GridRow[]) => rows.filter(r => r.x.trim() !== '' || r.y.trim() !== '').map(r => `${r.x.trim()}\t${r.y.trim()}`).join('\n')

/** Grid rows <-> stored points, saving a draft under its optimistic lock, undo history and unsaved edits. */
export function useDraftSave(url: Ref<string>, unit: Ref<ValueUnit>) {
  const api = useApi()
  const rows = ref<GridRow[]>([])
  const history = useUndoHistory(rows)
  /** The version loaded and the rows as last loaded or saved. */
  const loaded = ref<{ id: string, text: string } | null>(null)
  const dirty = computed(() => loaded.value !== null && rowsText(rows.value) !== loaded.value.text)
  const lockVersion = ref(0)
  const conflict = ref(false)
  const failure = ref<string | null>(null)
  const saved = ref<string | null>(null)
  const saving = ref(false)

  function load(v: VersionDto) {
    rows.value = v.points.map(p => ({ x: p.x, y: fromPerUnit(p.y, unit.value) }))
    lockVersion.value = v.lockVersion
    conflict.value = false
    loaded.value = { id: v.id, text: rowsText(rows.value) }
    history.reset()
  }
  /** The answer of our own save (its lock is ours already): nothing to load, the grid stays as it is. */
  const isOwnSave = (v: VersionDto) => v.id === loaded.value?.id && v.lockVersion === lockVersion.value
  function toPoints() {
    return rows.value.map((r, i) => ({ r, i })).filter(({ r }) => r.x.trim() !== '' || r.y.trim() !== '').map(({ r, i }) => {
      const x = parseNumberText(r.x)
      const y = parseNumberText(r.y)
      if (!x.ok || x.scale !== 1) throw new Error(`Row ${i + 1}: the axis value '${r.x}' ${x.ok ? 'cannot be a percentage' : x.reason}`)
      if (!y.ok) throw new Error(`Row ${i + 1}: the value '${r.y}' ${y.reason}`)
      return { x: x.value, y: toPerUnit(y, unit.value) }
    })
  }
  async function save(notes?: string): Promise<VersionDto | null> {
    failure.value = saved.value = null
    let body
    try {
      body = { lockVersion: lockVersion.value, points: toPoints(), ...(notes !== undefined ? { notes } : {}) }
    } catch (e) { failure.value = (e as Error).message; return null }
    const check = savePointsSchema.safeParse(body)
    if (!check.success) { failure.value = check.error.issues[0]!.message; return null }
    const text = rowsText(rows.value)
    const answer = await putUnderLock(api, `${url.value}/points`, body, { lockVersion, conflict, failure, saved, saving })
    if (answer && loaded.value) loaded.value = { id: answer.id, text }
    return answer
  }
  /** After a 409: take the newest lock and save what is on screen over it (nothing typed is lost). */
  async function saveMineOnTop() {
    const latest = await api<VersionDto>(url.value)
    lockVersion.value = latest.lockVersion
    conflict.value = false
    return save()
  }
  return { rows, history, dirty, lockVersion, conflict, failure, saved, saving, load, isOwnSave, save, saveMineOnTop }
}
