import { useForm } from 'vee-validate'
import { canonicalDecimal, parseNumberText } from '#shared/decimal-text'
import { pointEditSchema } from '#shared/schemas/tables'
import { readPastedBlock, readTypedNumber } from '~/utils/paste-block'
import type { UndoHistory } from './useUndoHistory'

export interface GridRow { x: string; y: string } // as shown: x in axis units, y in the table's value unit
export type GridCol = 'x' | 'y'
export interface GridMessage { text: string; tone: 'done' | 'note' | 'error' }

/**
 * State of the points grid: the active cell, the cell being edited (validated with the same zod schema the server
 * module uses, through vee-validate), pasting a block copied from a spreadsheet (utils/paste-block.ts). Every change
 * (a cell, a paste, a row added or removed) is one step of `history`.
 */
export function usePointsGrid(rows: Ref<GridRow[]>, history: UndoHistory<GridRow[]>) {
  const active = ref<{ row: number; col: GridCol }>({ row: 0, col: 'x' })
  const editing = ref(false)
  const draft = ref('')
  const message = ref<GridMessage | null>(null)
  const { validate, setValues } = useForm({ validationSchema: zodFormSchema(pointEditSchema), initialValues: { x: '', y: '' } })

  function move(dRow: number, dCol: number) {
    const cols: GridCol[] = ['x', 'y']
    let c = cols.indexOf(active.value.col) + dCol
    let r = active.value.row + dRow
    if (c > 1) { c = 0; r++ } else if (c < 0) { c = 1; r-- }
    active.value = { row: Math.max(0, Math.min(rows.value.length - 1, r)), col: cols[c]! }
  }
  function startEdit(initial?: string) {
    if (!rows.value.length) return
    draft.value = initial ?? rows.value[active.value.row]![active.value.col]
    editing.value = true
    message.value = null
  }
  async function commitEdit(): Promise<boolean> {
    if (!editing.value) return true
    const row = rows.value[active.value.row]!
    const typed = readTypedNumber(draft.value)
    setValues({ ...row, [active.value.col]: typed.text })
    const result = await validate()
    const parsed = parseNumberText(typed.text)
    const error = result.errors[active.value.col] ?? (active.value.col === 'x' && parsed.ok && parsed.scale !== 1 ? 'The axis value cannot be a percentage' : undefined)
    if (error) { message.value = { text: error, tone: 'error' }; return false }
    const text = parsed.ok && parsed.scale === 1 ? parsed.value : typed.text
    if (text !== row[active.value.col]) {
      history.record()
      replaceRow(active.value.row, { ...row, [active.value.col]: text })
    }
    editing.value = false
    message.value = typed.note ? { text: typed.note, tone: 'note' } : null
    return true
  }
  // a new array on every change: the table model recomputes from the data reference (and undo keeps the old one)
  function replaceRow(i: number, row: GridRow) {
    const next = rows.value.slice()
    next[i] = row
    rows.value = next
  }
  function cancelEdit() { editing.value = false; message.value = null }
  // rows is the grid's v-model: what is set shows in rows.value only after the parent renders, so work on `next`
  function addRow() {
    history.record()
    const next = [...rows.value, { x: '', y: '' }]
    rows.value = next
    active.value = { row: next.length - 1, col: 'x' }
    draft.value = ''
    editing.value = true
    message.value = null
  }
  function removeRow() {
    if (!rows.value.length) return
    history.record()
    const next = rows.value.filter((_, i) => i !== active.value.row)
    rows.value = next
    active.value = { row: Math.max(0, Math.min(next.length - 1, active.value.row)), col: active.value.col }
  }
  // the rows come back through the v-model: the active cell is kept inside them once they have
  async function step(go: () => boolean) {
    editing.value = false
    if (!go()) return
    message.value = null
    await nextTick()
    move(0, 0)
  }
  const undo = () => step(history.undo)
  const redo = () => step(history.redo)

  /** A block pasted at the active cell: one column lands in that column, two from the axis column; one undo step. */
  function paste(text: string) {
    const read = readPastedBlock(text, active.value.col === 'y' ? 'value' : 'axis')
    if (!read.ok) { message.value = { text: read.message, tone: 'error' }; return }
    const startCol: GridCol = read.width === 1 ? active.value.col : 'x'
    const next = rows.value.map(r => ({ ...r }))
    read.lines.forEach(({ cells }, i) => {
      const at = active.value.row + i
      while (next.length <= at) next.push({ x: '', y: '' })
      const target = next[at]!
      if (startCol === 'x') { target.x = canonicalText(cells[0]!); if (cells[1] !== undefined) target.y = canonicalText(cells[1]) } else target.y = canonicalText(cells[0]!)
    })
    history.record()
    rows.value = next
    const n = read.lines.length
    message.value = { text: `Pasted ${n} row${n === 1 ? '' : 's'}${read.header ? ' (the first line was taken as headings)' : ''}${read.decimalComma ? '; decimal commas read as points' : ''}.`, tone: 'done' }
  }
  const canonicalText = (v: string) => { const p = parseNumberText(v); return p.ok && p.scale === 1 ? canonicalDecimal(p.value) : v.trim() }

  return { active, editing, draft, message, move, startEdit, commitEdit, cancelEdit, addRow, removeRow, paste, undo, redo }
}
