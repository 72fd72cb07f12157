import { z } from '#shared/zod'
import { AXES, AXIS_UNITS, TABLE_KINDS, UNIT_KIND_MESSAGE, VALUE_UNITS, unitFitsKind } from '../tables'
import { IMPORT_COLUMNS_CAP, IMPORT_VALUE_COLUMNS_CAP } from '../import-caps'
import { BAND_VALUE_KINDS } from '../bands'
import { COMPOUNDING_IDS, SPLIT_METHOD_IDS } from '../engine/contract'

/** The person's answer when the axis holds bands ("55-59"): totals to split into single years (and how), or band rates. */
export const bandAnswerSchema = z.object({
  values: z.enum(BAND_VALUE_KINDS),
  split: z.enum(SPLIT_METHOD_IDS).default('sprague'),
})

// The mapping a person builds in the wizard; the preview and the final create both
// re-validate the stored cells against it on the server.
export const importColumnSchema = z.object({
  index: z.number().int().min(0).max(IMPORT_COLUMNS_CAP - 1),
  name: z.string().trim().min(1, { message: 'Give each new table a name' }).max(160),
  kind: z.enum(TABLE_KINDS),
  valueUnit: z.enum(VALUE_UNITS),
  /** How a curve's spot rates compound (curve kinds; annual when not said). */
  compounding: z.enum(COMPOUNDING_IDS).optional(),
}).refine(c => unitFitsKind(c.kind, c.valueUnit), { path: ['valueUnit'], message: UNIT_KIND_MESSAGE })

export const importMappingSchema = z.object({
  sheet: z.string().min(1).max(200),
  headerRow: z.number().int().min(0),
  axisColumn: z.number().int().min(0).max(IMPORT_COLUMNS_CAP - 1),
  axis: z.enum(AXES),
  axisUnit: z.enum(AXIS_UNITS),
  columns: z.array(importColumnSchema).min(1, { message: 'Choose at least one value column' })
    .max(IMPORT_VALUE_COLUMNS_CAP, { message: `Choose at most ${IMPORT_VALUE_COLUMNS_CAP} value columns per import (each becomes a table); import the others in a second pass` }),
  /** fixes typed in the preview, keyed "row:col" (0-based sheet coordinates) */
  edits: z.record(z.string().regex(/^\d+:\d+$/), z.string().max(60)).default({}),
  description: z.string().max(4000).default(''),
  bands: bandAnswerSchema.optional(),
  /** columns of experience behind crude rates: exposure (graduation weights) and optionally deaths (the fit tests) */
  experience: z.object({
    exposureColumn: z.number().int().min(0).max(IMPORT_COLUMNS_CAP - 1),
    deathsColumn: z.number().int().min(0).max(IMPORT_COLUMNS_CAP - 1).optional(),
  }).optional(),
}).superRefine((m, ctx) => {
  const names = new Set<string>()
  const e = m.experience
  if (e) {
    const taken = [m.axisColumn, ...m.columns.map(c => c.index)]
    if (taken.includes(e.exposureColumn)) ctx.addIssue({ code: 'custom', path: ['experience', 'exposureColumn'], message: 'The exposure column cannot also be the axis or a value column' })
    if (e.deathsColumn !== undefined && [...taken, e.exposureColumn].includes(e.deathsColumn)) ctx.addIssue({ code: 'custom', path: ['experience', 'deathsColumn'], message: 'The deaths column must be a column of its own' })
    if (m.bands) ctx.addIssue({ code: 'custom', path: ['experience'], message: 'Exposures and deaths go with single ages; a band axis is split first' })
  }
  m.columns.forEach((c, i) => {
    if (c.index === m.axisColumn) ctx.addIssue({ code: 'custom', path: ['columns', i, 'index'], message: 'The axis column cannot also be a value column' })
    const key = c.name.toLowerCase()
    if (names.has(key)) ctx.addIssue({ code: 'custom', path: ['columns', i, 'name'], message: `Two new tables are both called "${c.name}"` })
    names.add(key)
  })
})

export const importCommitSchema = z.object({
  mapping: importMappingSchema,
  /** warnings must be accepted explicitly; errors always block */
  acceptWarnings: z.boolean().default(false),
})

export type ImportMapping = z.infer<typeof importMappingSchema>
