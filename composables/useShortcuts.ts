import { SHORTCUTS, isTypingTarget, matchesKeys } from '~/utils/shortcut-list'

// The one keyboard listener of the app. Pages and components take a shortcut of utils/shortcut-list.ts while they are
// mounted; the newest taker of an id that is enabled handles it. Nothing fires while a dialog is open (it has its own keys) or, for
// single keys, while typing in a field.

interface Taker { run: (e: KeyboardEvent) => unknown, enabled?: () => boolean }
const takers = new Map<string, Taker[]>()
/** Ids taken on the page now (the "?" dialog lists these first). Changed only in the browser (mounted hooks). */
const taken = shallowRef<string[]>([])
let installed = false

function onKeydown(e: KeyboardEvent) {
  if (e.defaultPrevented || e.isComposing || e.repeat) return
  if (document.querySelector('dialog[open]')) return
  const typing = isTypingTarget(e.target)
  for (const s of SHORTCUTS) {
    if (s.listedOnly || !s.keys.some(k => matchesKeys(e, k))) continue
    if (typing && !s.whileTyping) continue
    const taker = [...(takers.get(s.id) ?? [])].reverse().find(t => !t.enabled || t.enabled())
    if (!taker) continue
    e.preventDefault()
    void taker.run(e)
    return
  }
}

/** The ids taken now, also on <html data-shortcuts="..."> (browser tests wait for a page's shortcuts there). */
function updateTaken() {
  taken.value = [...takers.keys()].filter(k => takers.get(k)!.length)
  document.documentElement.dataset.shortcuts = taken.value.join(' ')
}

/** Handles shortcut `id` while the calling component is mounted (and `enabled()` says so). */
export function useShortcut(id: string, run: Taker['run'], enabled?: () => boolean) {
  const taker: Taker = { run, enabled }
  onMounted(() => {
    if (!installed) { window.addEventListener('keydown', onKeydown); installed = true }
    takers.set(id, [...(takers.get(id) ?? []), taker])
    updateTaken()
  })
  onBeforeUnmount(() => {
    takers.set(id, (takers.get(id) ?? []).filter(t => t !== taker))
    updateTaken()
  })
}

/** The ids of the shortcuts the page on screen has taken. */
export function useTakenShortcuts() {
  return readonly(taken)
}
