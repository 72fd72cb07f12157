/**
 * Asks before unsaved edits are lost: leaving the page inside the app (the router, answered through the page's
 * AppConfirm bound to `asking`), closing or reloading the tab (the browser's own question), or anything else the page
 * calls `confirmDrop()` for (choosing another version). Nothing is asked once the edits are saved.
 */
export function useLeaveGuard(dirty: () => boolean) {
  const asking = ref(false)
  let answer: ((drop: boolean) => void) | null = null

  function confirmDrop(): Promise<boolean> {
    if (!dirty()) return Promise.resolve(true)
    answer?.(false)
    asking.value = true
    return new Promise((resolve) => { answer = resolve })
  }
  function settle(drop: boolean) {
    const a = answer
    answer = null
    asking.value = false
    a?.(drop)
  }
  // Cancel, Escape or a click outside close the dialog: stay
  watch(asking, (open) => { if (!open) settle(false) })
  onBeforeRouteLeave(() => confirmDrop())

  function onBeforeUnload(e: BeforeUnloadEvent) {
    if (!dirty()) return
    e.preventDefault()
    e.returnValue = '' // older browsers ask only when returnValue is set
  }
  onMounted(() => window.addEventListener('beforeunload', onBeforeUnload))
  onBeforeUnmount(() => window.removeEventListener('beforeunload', onBeforeUnload))

  return { asking, confirmDrop, drop: () => settle(true) }
}
