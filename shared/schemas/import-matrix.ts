import { z } from '#shared/zod'
import { AXES, AXIS_UNITS, COL_AXES, TABLE_KINDS, UNIT_KIND_MESSAGE, VALUE_UNITS, unitFitsKind } from '../tables'
import { IMPORT_COLUMNS_CAP } from '../import-caps'

// A matrix sheet (issue 17): row axis values down one column, column axis values (durations) across the header row, an
// ultimate column recognised by its heading; one two-way table with a working draft. Blank cells are left to fill.
export const importMatrixSchema = z.object({
  sheet: z.string().min(1).max(200),
  headerRow: z.number().int().min(0),
  axisColumn: z.number().int().min(0).max(IMPORT_COLUMNS_CAP - 1),
  /** The columns read as values (their headings give the duration, or say ultimate). */
  columns: z.array(z.number().int().min(0).max(IMPORT_COLUMNS_CAP - 1)).min(1, { message: 'Choose at least one column of values' }).max(IMPORT_COLUMNS_CAP),
  axis: z.enum(AXES),
  axisUnit: z.enum(AXIS_UNITS),
  colAxis: z.enum(COL_AXES),
  colAxisUnit: z.enum(AXIS_UNITS),
  name: z.string().trim().min(1, { message: 'Give the new table a name' }).max(160),
  kind: z.enum(TABLE_KINDS),
  valueUnit: z.enum(VALUE_UNITS),
  /** fixes typed in the preview, keyed "row:col" (0-based sheet coordinates) */
  edits: z.record(z.string().regex(/^\d+:\d+$/), z.string().max(60)).default({}),
  description: z.string().max(4000).default(''),
}).refine(m => unitFitsKind(m.kind, m.valueUnit), { path: ['valueUnit'], message: UNIT_KIND_MESSAGE })
  .refine(m => !m.columns.includes(m.axisColumn), { path: ['columns'], message: 'The row axis column cannot also be a column of values' })

export const importMatrixCommitSchema = z.object({ mapping: importMatrixSchema, acceptWarnings: z.boolean().default(false) })

export type ImportMatrixMapping = z.infer<typeof importMatrixSchema>
