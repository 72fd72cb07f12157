import { ref } from 'vue'
import { describe, expect, it } from 'vitest'
import { useUndoHistory } from '~~/composables/useUndoHistory'

describe('useUndoHistory', () => {
  it('undoes and redoes changes one step at a time; a new change drops what could be redone', () => {
    const rows = ref(['a'])
    const h = useUndoHistory(rows)
    expect(h.canUndo.value).toBe(false)
    h.record(); rows.value = ['a', 'b']
    h.record(); rows.value = ['a', 'b', 'c']
    expect(h.undo()).toBe(true)
    expect(rows.value).toEqual(['a', 'b'])
    expect(h.canRedo.value).toBe(true)
    expect(h.redo()).toBe(true)
    expect(rows.value).toEqual(['a', 'b', 'c'])
    h.undo(); h.undo()
    expect(rows.value).toEqual(['a'])
    expect(h.undo()).toBe(false)
    h.redo()
    h.record(); rows.value = ['x']
    expect(h.canRedo.value).toBe(false)
    h.undo()
    expect(rows.value).toEqual(['a', 'b'])
  })
  it('snapshots a state changed in place with its copy function, keeps at most `limit` steps, and forgets them on reset', () => {
    const cells = ref<Record<string, string>>({ a: '1' })
    const h = useUndoHistory(cells, v => ({ ...v }), 3)
    for (const v of ['2', '3', '4', '5']) { h.record(); cells.value.a = v }
    while (h.undo());
    expect(cells.value).toEqual({ a: '2' })
    h.reset()
    expect(h.canRedo.value).toBe(false)
  })
})
