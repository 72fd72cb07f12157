import type { CompareInput } from '#shared/schemas/fills'
import type { CompareResponseDto } from '#shared/types/fills'

/** Runs a comparison with a cancel switch and a running clock. */
export function useCompareRun(url: () => string) {
  const api = useApi()
  const running = ref(false)
  const elapsedMs = ref(0)
  const error = ref<string | null>(null)
  const response = shallowRef<CompareResponseDto | null>(null)
  /** How many runs have been started, and which one the response on screen answers (set together with it). */
  const started = ref(0)
  const answered = ref(0)
  /** Methods filled so far, as the server reports them while it runs (null until it first answers). */
  const progress = ref<{ done: number, total: number } | null>(null)
  let controller: AbortController | null = null
  let runUrl: string | null = null
  let timer: ReturnType<typeof setInterval> | undefined
  let poller: ReturnType<typeof setInterval> | undefined

  function watchProgress(runId: string, signal: AbortSignal) {
    const progressUrl = url().replace(/^(\/api\/orgs\/[^/]+)\/.*$/, `$1/compare-progress/${runId}`)
    let asking = false
    poller = setInterval(async () => {
      if (asking || signal.aborted) return
      asking = true
      try { progress.value = await api<{ done: number, total: number }>(progressUrl, { signal }) }
      catch { /* not started yet, or finished: the bar keeps its last state */ }
      finally { asking = false }
    }, 400)
  }

  async function run(body: CompareInput) {
    controller?.abort()
    controller = new AbortController()
    const id = ++started.value
    const begun = performance.now()
    const runId = crypto.randomUUID()
    runUrl = url().replace(/^(\/api\/orgs\/[^/]+)\/.*$/, `$1/runs/${runId}`)
    running.value = true
    error.value = null
    elapsedMs.value = 0
    progress.value = null
    clearInterval(timer)
    clearInterval(poller)
    timer = setInterval(() => { elapsedMs.value = performance.now() - begun }, 100)
    watchProgress(runId, controller.signal)
    try {
      const answer = await api<CompareResponseDto>(url(), { method: 'POST', body: { ...body, runId }, signal: controller.signal })
      if (id === started.value) {
        answered.value = id
        response.value = answer
      }
    }
    catch (e) {
      if (id !== started.value) return // a newer run replaced this one
      error.value = (e as { name?: string }).name === 'AbortError' || controller?.signal.aborted
        ? 'Comparison cancelled; the previous results (if any) stay on screen.'
        : apiErrorMessage(e, 'The comparison failed.')
    }
    finally {
      if (id === started.value) {
        clearInterval(timer)
        clearInterval(poller)
        elapsedMs.value = performance.now() - begun
        running.value = false
      }
    }
  }
  /** Closing the connection cancels the run; the explicit cancel also reaches it through a proxy that keeps connections open. */
  function cancel() {
    controller?.abort()
    if (runUrl) api(runUrl, { method: 'DELETE' }).catch(() => {})
  }
  onBeforeUnmount(() => { controller?.abort(); clearInterval(timer); clearInterval(poller) })
  return { running, elapsedMs, error, response, started, answered, progress, run, cancel }
}
