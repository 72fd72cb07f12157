import { z } from '#shared/zod'
import { EXTRAPOLATION_RULES, METHOD_IDS } from '../engine/contract'
import { MIN_RATIONALE } from '../fills'
import { benchGridSchema } from './fills'

// The two-way fill bench (issue 17): a method per axis, several choices side by side, one chosen with its reasons.
const plainDecimal = z.string().trim().regex(/^-?\d+(\.\d+)?$/, { message: 'Enter a plain decimal like 0.03' })
const axisMethod = z.object({ method: z.enum(METHOD_IDS), options: z.record(z.string().max(40), z.string().trim().max(60)).optional() })
export const gridChoiceSchema = z.object({ x: axisMethod, d: axisMethod, label: z.string().trim().min(1).max(80).optional() })
/** At most this many choices side by side. */
export const MAX_GRID_CHOICES = 6

const settings = {
  /** the rows (row axis) and the select columns to fill; the ultimate column is filled on the same rows */
  grid: z.object({ x: benchGridSchema, d: benchGridSchema }),
  transform: z.enum(['none', 'log', 'logit', 'cumulative-hazard']).default('none'),
  extrapolation: z.enum(EXTRAPOLATION_RULES).default('error'),
  precision: z.number().int().min(6).max(50).optional(),
  money: z.object({ ages: z.array(z.number().int().min(0).max(150)).min(1).max(20).optional(), interest: plainDecimal.optional() }).optional(),
}

export const gridCompareSchema = z.object({
  ...settings,
  choices: z.array(gridChoiceSchema).min(1, { message: 'Choose at least one pair of methods' }).max(MAX_GRID_CHOICES, { message: `Compare at most ${MAX_GRID_CHOICES} choices at once` }),
})

export const gridFillSchema = z.object({
  ...settings,
  choice: gridChoiceSchema,
  rationale: z.string().trim().min(MIN_RATIONALE, { message: `Say why in at least ${MIN_RATIONALE} characters` }).max(4000),
  lockVersion: z.number().int().min(0),
})

export type GridCompareInput = z.infer<typeof gridCompareSchema>
export type GridFillInput = z.infer<typeof gridFillSchema>
