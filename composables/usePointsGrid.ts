import { useForm } from 'vee-validate'
import { canonicalDecimal, parseNumberText } from '#shared/decimal-text'
import { pointEditSchema } from '#shared/schemas/tables'

export interface GridRow { x: string; y: string } // as shown: x in axis units, y in the table's value unit
export type GridCol = 'x' | 'y'

/**
 * State of the points grid: the active cell, the cell being edited (validated with the same zod
 * schema the server module uses, through vee-validate), pasting a block copied from a spreadsheet.
 */
export function usePointsGrid(rows: Ref<GridRow[]>) {
  const active = ref<{ row: number; col: GridCol }>({ row: 0, col: 'x' })
  const editing = ref(false)
  const draft = ref('')
  const message = ref<string | null>(null)
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
    const next = { ...row, [active.value.col]: draft.value }
    setValues(next)
    const result = await validate()
    const error = result.errors[active.value.col] ?? (active.value.col === 'x' && parseNumberText(draft.value).ok && (parseNumberText(draft.value) as { scale: number }).scale !== 1 ? 'The axis value cannot be a percentage' : undefined)
    if (error) { message.value = error; return false }
    const parsed = parseNumberText(draft.value)
    replaceRow(active.value.row, { ...row, [active.value.col]: parsed.ok && parsed.scale === 1 ? parsed.value : draft.value.trim() })
    editing.value = false
    message.value = null
    return true
  }
  // a new array on every change: the table model recomputes from the data reference
  function replaceRow(i: number, row: GridRow) {
    const next = rows.value.slice()
    next[i] = row
    rows.value = next
  }
  function cancelEdit() { editing.value = false; message.value = null }
  function addRow() {
    rows.value = [...rows.value, { x: '', y: '' }]
    active.value = { row: rows.value.length - 1, col: 'x' }
    startEdit('')
  }
  function removeRow() {
    if (!rows.value.length) return
    rows.value = rows.value.filter((_, i) => i !== active.value.row)
    move(0, 0)
  }

  /** Tab/newline-separated cells; a first line that is not numeric is taken as headings. */
  function paste(text: string) {
    const lines = text.replace(/\r/g, '').split('\n').filter(l => l.trim() !== '').map(l => l.split('\t'))
    if (lines.length && !lines[0]!.some(v => parseNumberText(v).ok)) lines.shift()
    const startCol = lines.every(l => l.length === 1) ? active.value.col : 'x'
    for (const [i, cells] of lines.entries()) {
      for (const [j, v] of cells.slice(0, startCol === 'x' ? 2 : 1).entries()) {
        const p = parseNumberText(v)
        if (!p.ok) { message.value = `Pasted line ${i + 1}, cell ${j + 1}: '${v}' ${p.reason}. Nothing was pasted.`; return }
      }
    }
    const next = rows.value.map(r => ({ ...r }))
    lines.forEach((cells, i) => {
      const at = active.value.row + i
      while (next.length <= at) next.push({ x: '', y: '' })
      const target = next[at]!
      if (startCol === 'x') { target.x = canonicalText(cells[0]!); if (cells[1] !== undefined) target.y = canonicalText(cells[1]) } else target.y = canonicalText(cells[0]!)
    })
    rows.value = next
    message.value = `Pasted ${lines.length} row(s).`
  }
  const canonicalText = (v: string) => { const p = parseNumberText(v); return p.ok && p.scale === 1 ? canonicalDecimal(p.value) : v.trim() }

  return { active, editing, draft, message, move, startEdit, commitEdit, cancelEdit, addRow, removeRow, paste }
}
