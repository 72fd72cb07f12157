import { z } from '#shared/zod'
import { AXES, AXIS_UNITS, TABLE_KINDS, UNIT_KIND_MESSAGE, VALUE_UNITS, unitFitsKind } from '../tables'
import { MAX_SIGNIFICANT_DIGITS, canonicalDecimal, parseNumberText } from '../decimal-text'
import { COMPOUNDING_IDS } from '../engine/contract'

// Shared by the points grid (vee-validate through utils/zod-form.ts) and the handlers.
export const decimalText = z.string().trim()
  .min(1, { message: 'Enter a number' })
  .max(60, { message: `Use at most ${MAX_SIGNIFICANT_DIGITS} significant digits` })
  .refine(v => parseNumberText(v).ok, { message: 'Enter a number like 0.0123, 1.23% or 1,250' })

/** A stored point: canonical per-unit decimals (what the grid sends after converting units). */
export const pointSchema = z.object({
  x: z.string().regex(/^-?\d+(\.\d+)?$/, { message: 'The axis value must be a plain decimal' }),
  y: z.string().regex(/^-?\d+(\.\d+)?$/, { message: 'The value must be a plain decimal' }),
})

export const MAX_POINTS = 20_000

export const savePointsSchema = z.object({
  lockVersion: z.number().int().min(0),
  points: z.array(pointSchema).min(1, { message: 'A version needs at least one point' }).max(MAX_POINTS),
  notes: z.string().max(4000).optional(),
}).superRefine((v, ctx) => {
  const seen = new Set<string>()
  v.points.forEach((p, i) => {
    const key = canonicalDecimal(p.x)
    if (seen.has(key)) ctx.addIssue({ code: 'custom', path: ['points', i, 'x'], message: `The axis value ${p.x} appears twice` })
    seen.add(key)
  })
})

/** One cell being edited in the grid, as the person typed it (in the table's display unit). */
export const pointEditSchema = z.object({ x: decimalText, y: decimalText })

export const tableUpdateSchema = z.object({
  name: z.string().trim().min(1, { message: 'Enter a name' }).max(160).optional(),
  kind: z.enum(TABLE_KINDS).optional(),
  axis: z.enum(AXES).optional(),
  axisUnit: z.enum(AXIS_UNITS).optional(),
  valueUnit: z.enum(VALUE_UNITS).optional(),
  compounding: z.enum(COMPOUNDING_IDS).optional(),
  description: z.string().max(4000).optional(),
  tags: z.array(z.string().trim().min(1).max(40)).max(20).optional(),
})

export const newDraftSchema = z.object({ fromNumber: z.number().int().min(1) })

export type SavePointsInput = z.infer<typeof savePointsSchema>
export type TableUpdateInput = z.infer<typeof tableUpdateSchema>

/** The table details form: the same rules as tableUpdateSchema, with the tags typed as one comma-separated line. */
export const tableDetailsFormSchema = z.object({
  name: z.string().trim().min(1, { message: 'Enter a name' }).max(160, { message: 'Use at most 160 characters' }),
  kind: z.enum(TABLE_KINDS),
  axis: z.enum(AXES),
  axisUnit: z.enum(AXIS_UNITS),
  valueUnit: z.enum(VALUE_UNITS),
  compounding: z.enum(COMPOUNDING_IDS),
  description: z.string().max(4000, { message: 'Use at most 4,000 characters' }),
  tags: z.string()
    .transform(text => [...new Set(text.split(',').map(t => t.trim()).filter(Boolean))])
    .pipe(z.array(z.string().max(40, { message: 'Keep each tag to 40 characters' })).max(20, { message: 'Use at most 20 tags' })),
}).refine(v => unitFitsKind(v.kind, v.valueUnit), { path: ['valueUnit'], message: UNIT_KIND_MESSAGE })
