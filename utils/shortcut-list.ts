// The app's keyboard shortcuts: one list, read by the registry (composables/useShortcuts.ts) and by the "?" dialog
// (components/app/AppShortcutsDialog.vue). A page takes a shortcut with useShortcut(id, handler) while it is on screen.
// Keys: 'mod' is Ctrl (Cmd on a Mac); a single character needs no modifier and never fires while typing in a field.

export const SHORTCUT_GROUPS = ['Every page', 'Table page (working draft)', 'Fill bench', 'Two-way bench', 'Graduate step', 'Import wizard', 'Lists'] as const
export type ShortcutGroup = typeof SHORTCUT_GROUPS[number]

export interface Shortcut {
  id: string
  group: ShortcutGroup
  keys: string[]
  label: string
  /** Fires in a text field too (Ctrl+S keeps the cell being typed, then saves). */
  whileTyping?: boolean
  /** Handled by the browser or the page itself (listed only). */
  listedOnly?: boolean
}

export const SHORTCUTS: Shortcut[] = [
  { id: 'help', group: 'Every page', keys: ['?'], label: 'List the keyboard shortcuts' },
  { id: 'close', group: 'Every page', keys: ['Escape'], label: 'Close a dialog; stop typing in a grid cell', listedOnly: true },
  { id: 'draft-save', group: 'Table page (working draft)', keys: ['mod+s'], label: 'Save the draft (a cell being typed is kept first)', whileTyping: true },
  { id: 'draft-undo', group: 'Table page (working draft)', keys: ['mod+z'], label: 'Undo the last cell edit, paste or row added or removed' },
  { id: 'draft-redo', group: 'Table page (working draft)', keys: ['mod+shift+z', 'mod+y'], label: 'Redo what was undone' },
  { id: 'bench-run', group: 'Fill bench', keys: ['r'], label: 'Run the comparison with the settings shown' },
  { id: 'grid-bench-run', group: 'Two-way bench', keys: ['r'], label: 'Run the comparison with the settings shown' },
  { id: 'graduate-run', group: 'Graduate step', keys: ['r'], label: 'Graduate again with the settings shown' },
  { id: 'wizard-next', group: 'Import wizard', keys: ['n'], label: 'Next step (sheet, columns, check)' },
  { id: 'wizard-back', group: 'Import wizard', keys: ['p'], label: 'Previous step' },
  { id: 'focus-search', group: 'Lists', keys: ['/'], label: 'Go to the search or filter field' },
]

interface KeyLike { key: string, ctrlKey: boolean, metaKey: boolean, altKey: boolean, shiftKey: boolean }

/** Whether a key press is the combination written in `keys` ('mod+shift+z', '?', 'r'). */
export function matchesKeys(e: KeyLike, keys: string): boolean {
  const parts = keys.toLowerCase().split('+')
  const key = parts.pop()!
  if (parts.includes('mod') !== (e.ctrlKey || e.metaKey) || parts.includes('alt') !== e.altKey) return false
  const pressed = e.key.toLowerCase()
  // a character typed with Shift ('?') carries Shift in the character itself
  if (key.length === 1 && !/[a-z0-9]/.test(key)) return pressed === key
  return pressed === key && parts.includes('shift') === e.shiftKey
}

/** A key combination as people read it: 'Ctrl + Shift + Z' (on a Mac '⌘ + Shift + Z'). */
export function keysText(keys: string, mac: boolean): string {
  return keys.split('+').map(k => (k === 'mod' ? (mac ? '⌘' : 'Ctrl') : k === 'shift' ? 'Shift' : k === 'alt' ? (mac ? 'Option' : 'Alt') : k.length === 1 ? k.toUpperCase() : k)).join(' + ')
}

/** A field where keys type text: single-key shortcuts leave it alone. */
export function isTypingTarget(target: EventTarget | null): boolean {
  const el = target as HTMLElement | null
  if (!el || typeof el.tagName !== 'string') return false
  if (el.isContentEditable || el.tagName === 'TEXTAREA' || el.tagName === 'SELECT') return true
  return el.tagName === 'INPUT' && !['checkbox', 'radio', 'button', 'submit', 'reset', 'range', 'color', 'file'].includes((el as HTMLInputElement).type)
}
