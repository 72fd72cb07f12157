import { computed, shallowRef, type Ref } from 'vue'

/**
 * Undo and redo for an editor's state (the points grid's rows, the matrix's cells): each change calls `record()` first,
 * so one typed cell, one paste or one row added or removed is one step. `copy` snapshots a state that is changed in
 * place (the matrix); states replaced on every change (the rows) keep the old value as it is.
 */
export function useUndoHistory<T>(state: Ref<T>, copy: (v: T) => T = v => v, limit = 200) {
  const past = shallowRef<T[]>([])
  const future = shallowRef<T[]>([])
  /** Call before a change: the state as it is now (or `before`, taken earlier) becomes the step Undo goes back to. */
  function record(before: T = copy(state.value)) {
    past.value = [...past.value.slice(1 - limit), before]
    future.value = []
  }
  function undo(): boolean {
    const previous = past.value.at(-1)
    if (previous === undefined) return false
    future.value = [...future.value, copy(state.value)]
    past.value = past.value.slice(0, -1)
    state.value = previous
    return true
  }
  function redo(): boolean {
    const next = future.value.at(-1)
    if (next === undefined) return false
    past.value = [...past.value, copy(state.value)]
    future.value = future.value.slice(0, -1)
    state.value = next
    return true
  }
  /** Another version was loaded: its steps start afresh. */
  function reset() {
    past.value = []
    future.value = []
  }
  const canUndo = computed(() => past.value.length > 0)
  const canRedo = computed(() => future.value.length > 0)
  return { record, undo, redo, reset, canUndo, canRedo }
}

export type UndoHistory<T> = ReturnType<typeof useUndoHistory<T>>
