import type { GridCompareDto } from '#shared/types/grid-fills'
import type { GridCompareInput } from '#shared/schemas/grid-fills'

/** Runs the comparison and keeps the request that produced what is on screen (a save names exactly that). */
export function useGridCompare(url: () => string) {
  const result = shallowRef<GridCompareDto | null>(null)
  const shown = shallowRef<GridCompareInput | null>(null)
  const running = ref(false)
  const error = ref<string | null>(null)
  const api = useApi()
  async function run(body: GridCompareInput) {
    running.value = true
    error.value = null
    try {
      result.value = await api<GridCompareDto>(url(), { method: 'POST', body })
      shown.value = body
    } catch (e) { error.value = apiErrorMessage(e) } finally { running.value = false }
  }
  return { result, shown, running, error, run }
}
