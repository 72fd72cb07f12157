import { z } from '#shared/zod'
import { AXES, AXIS_UNITS, COL_AXES, TABLE_KINDS, UNIT_KIND_MESSAGE, VALUE_UNITS, unitFitsKind } from '../tables'
import { canonicalDecimal } from '../decimal-text'
import { MAX_POINTS } from './tables'

// Two-way tables (issue 17): cells are stored per-unit decimals; d null is the ultimate column.
const plain = (what: string) => z.string().regex(/^-?\d+(\.\d+)?$/, { message: `The ${what} must be a plain decimal` })

export const cellSchema = z.object({ x: plain('row value'), d: plain('column value').nullable(), y: plain('value') })

/** Cells of one version: each (x, d) once. */
const cellsSchema = z.array(cellSchema).min(1, { message: 'A version needs at least one given cell' }).max(MAX_POINTS)
  .superRefine((cells, ctx) => {
    const seen = new Set<string>()
    cells.forEach((c, i) => {
      const key = `${canonicalDecimal(c.x)}|${c.d === null ? 'ult' : canonicalDecimal(c.d)}`
      if (seen.has(key)) ctx.addIssue({ code: 'custom', path: [i], message: `The cell at ${c.x}, ${c.d ?? 'ultimate'} appears twice` })
      seen.add(key)
    })
  })

export const createTwoWaySchema = z.object({
  name: z.string().trim().min(1, { message: 'Enter a name' }).max(160),
  kind: z.enum(TABLE_KINDS),
  axis: z.enum(AXES),
  axisUnit: z.enum(AXIS_UNITS).default('years'),
  colAxis: z.enum(COL_AXES),
  colAxisUnit: z.enum(AXIS_UNITS).default('years'),
  hasUltimate: z.boolean().default(false),
  valueUnit: z.enum(VALUE_UNITS).default('per-unit'),
  description: z.string().max(4000).default(''),
  cells: cellsSchema,
}).refine(v => unitFitsKind(v.kind, v.valueUnit), { path: ['valueUnit'], message: UNIT_KIND_MESSAGE })
  .refine(v => v.hasUltimate || v.cells.every(c => c.d !== null), { path: ['cells'], message: 'This table has no ultimate column; give every cell a column value' })

export const saveCellsSchema = z.object({
  lockVersion: z.number().int().min(0),
  cells: cellsSchema,
  notes: z.string().max(4000).optional(),
})

export type CreateTwoWayInput = z.infer<typeof createTwoWaySchema>
export type SaveCellsInput = z.infer<typeof saveCellsSchema>
