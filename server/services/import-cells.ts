import { QueryTypes, type Transaction } from 'sequelize'
import type { ImportMapping } from '#shared/schemas/imports'
import type { StoredSheet } from '../lib/import/read-workbook'

const PICK_SHEET = `FROM imports i CROSS JOIN LATERAL (SELECT e AS s FROM jsonb_array_elements(i.sheets) e WHERE e->>'name' = :sheet LIMIT 1) picked`

/**
 * One sheet of a stored upload with only the cells a mapping reads (its axis, value and experience columns; the others left out):
 * PostgreSQL picks them out of the JSONB and sends one row per sheet row, so preview and commit never parse a whole
 * workbook in one piece (which held every other request for a few hundred ms at the cell cap). jsonb, not text[]: pg
 * parses JSON natively, arrays in JavaScript (about twice as slow). null: no such sheet.
 */
export function loadMappedSheet(importId: string, m: ImportMapping, t?: Transaction): Promise<StoredSheet | null> {
  const e = m.experience
  const experience = e ? [e.exposureColumn, ...(e.deathsColumn !== undefined ? [e.deathsColumn] : [])] : []
  return loadSheetColumns(importId, m.sheet, [m.axisColumn, ...m.columns.map(c => c.index), ...experience], t)
}

/** The same for any list of columns (a matrix sheet reads its row axis column and every column of values). */
export async function loadSheetColumns(importId: string, sheetName: string, cols: number[], t?: Transaction): Promise<StoredSheet | null> {
  const m = { sheet: sheetName }
  // written into the SQL below: the mapping schema allows only small whole numbers, checked again here
  if (!cols.every(c => Number.isInteger(c) && c >= 0 && c < 1000)) throw new Error('column index out of range')
  const db = useDb()
  const [meta] = await db.query<{ col_count: number; row_count: number; formulas: string[] }>(
    `SELECT (picked.s->>'colCount')::int AS col_count, jsonb_array_length(picked.s->'rows') AS row_count,
       ARRAY(SELECT f FROM jsonb_array_elements_text(picked.s->'formulas') f WHERE split_part(f, ':', 2)::int = ANY(ARRAY[:cols]::int[])) AS formulas
     ${PICK_SHEET} WHERE i.id = :id`,
    { replacements: { id: importId, sheet: m.sheet, cols }, type: QueryTypes.SELECT, transaction: t })
  if (!meta) return null
  const picked = await db.query<{ cells: (string | null)[] }>(
    `SELECT jsonb_build_array(${cols.map(c => `e.row->${c}`).join(', ')}) AS cells
     ${PICK_SHEET} CROSS JOIN LATERAL jsonb_array_elements(picked.s->'rows') WITH ORDINALITY AS e(row, ord)
     WHERE i.id = :id ORDER BY e.ord`,
    { replacements: { id: importId, sheet: m.sheet }, type: QueryTypes.SELECT, transaction: t })
  const rows = picked.map(({ cells }) => {
    const row: (string | null)[] = []
    cols.forEach((c, k) => { row[c] = cells[k] ?? null })
    return row
  })
  return { name: m.sheet, rows, formulas: meta.formulas, colCount: meta.col_count }
}
