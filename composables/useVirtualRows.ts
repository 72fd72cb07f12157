import { useVirtualizer } from '@tanstack/vue-virtual'
import type { Ref } from 'vue'

/** The rows of a long table drawn as they scroll into view (29 px each), with the padding above and below them. */
export function useVirtualRows(count: () => number, scroller: Ref<HTMLElement | null>, rowHeight = 29) {
  const virtual = useVirtualizer(computed(() => ({ count: count(), getScrollElement: () => scroller.value, estimateSize: () => rowHeight, overscan: 12 })))
  const items = computed(() => virtual.value.getVirtualItems())
  const padTop = computed(() => items.value[0]?.start ?? 0)
  const padBottom = computed(() => virtual.value.getTotalSize() - (items.value.at(-1)?.end ?? 0))
  return { items, padTop, padBottom }
}
