import { fromPerUnit, parseNumberText, toPerUnit } from '#shared/decimal-text'
import { savePointsSchema } from '#shared/schemas/tables'
import type { ValueUnit } from '#shared/tables'
import type { VersionDto } from '#shared/types/tables'
import type { GridRow } from './usePointsGrid'

/** Grid rows <-> stored points, and saving a draft under its optimistic lock. */
export function useDraftSave(url: Ref<string>, unit: Ref<ValueUnit>) {
  const api = useApi()
  const rows = ref<GridRow[]>([])
  const lockVersion = ref(0)
  const conflict = ref(false)
  const failure = ref<string | null>(null)
  const saved = ref<string | null>(null)
  const saving = ref(false)

  function load(v: VersionDto) {
    rows.value = v.points.map(p => ({ x: p.x, y: fromPerUnit(p.y, unit.value) }))
    lockVersion.value = v.lockVersion
    conflict.value = false
  }
  function toPoints() {
    return rows.value.filter(r => r.x.trim() !== '' || r.y.trim() !== '').map((r, i) => {
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
    saving.value = true
    try {
      const v = await api<VersionDto>(`${url.value}/points`, { method: 'PUT', body })
      lockVersion.value = v.lockVersion
      saved.value = `Saved at ${new Date().toLocaleTimeString('en-GB')}.`
      return v
    } catch (e) {
      conflict.value = apiErrorCode(e) === 'draft-conflict'
      failure.value = apiErrorMessage(e)
      return null
    } finally { saving.value = false }
  }
  /** After a 409: take the newest lock and save what is on screen over it (nothing typed is lost). */
  async function saveMineOnTop() {
    const latest = await api<VersionDto>(url.value)
    lockVersion.value = latest.lockVersion
    conflict.value = false
    return save()
  }
  return { rows, lockVersion, conflict, failure, saved, saving, load, save, saveMineOnTop }
}
