/**
 * False until the page is hydrated (mounted in the browser), then true. Forms disable their fields and buttons until
 * then: typed into or submitted before, a form would lose what was typed to the hydration, or be sent by the browser
 * itself with the password in the request. A field marked autofocus, skipped by the browser while disabled, gets the
 * focus once enabled (unless the person has already put it elsewhere).
 */
export function useHydrated(): Ref<boolean> {
  const hydrated = ref(false)
  onMounted(async () => {
    hydrated.value = true
    await nextTick()
    if (document.activeElement === document.body) document.querySelector<HTMLElement>('[autofocus]')?.focus()
  })
  return hydrated
}
