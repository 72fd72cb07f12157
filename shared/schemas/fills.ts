import { z } from '#shared/zod'
import { EXTRAPOLATION_RULES, METHOD_IDS, TRANSFORM_IDS } from '../engine/contract'
import { MAX_BENCH_METHODS, MAX_BENCH_POINTS, MIN_RATIONALE, gridPointCount, parseStep } from '../fills'

// Shared by the fill bench form and the compare / fill handlers.
const plainDecimal = z.string().trim().regex(/^-?\d+(\.\d+)?$/, { message: 'Enter a plain decimal like 20 or 0.25' })

export const benchGridSchema = z.object({
  from: plainDecimal,
  to: plainDecimal,
  step: z.string().trim().refine(v => parseStep(v) !== null, { message: 'Enter a step like 1, 0.5 or 1/12' }),
}).superRefine((g, ctx) => {
  const n = gridPointCount(g.from, g.to, g.step)
  if (n === null) ctx.addIssue({ code: 'custom', path: ['to'], message: 'The grid must end at or after where it starts' })
  else if (n > MAX_BENCH_POINTS) ctx.addIssue({ code: 'custom', path: ['step'], message: `That grid has ${n} points; at most ${MAX_BENCH_POINTS} fit on the bench` })
})

export const methodChoiceSchema = z.object({
  method: z.enum(METHOD_IDS),
  options: z.record(z.string().max(40), z.string().trim().max(60)).optional(),
  transform: z.enum(TRANSFORM_IDS).optional(),
  label: z.string().trim().min(1).max(80).optional(),
})

export const moneyChoiceSchema = z.object({
  ages: z.array(z.number().int().min(0).max(150)).min(1).max(20).optional(),
  interest: plainDecimal.optional(),
  annuityTerms: z.array(z.number().int().min(1).max(200)).min(1).max(20).optional(),
  keyTerms: z.array(plainDecimal).min(1).max(20).optional(),
})

/** Options of an old-age closure (gompertz, kannisto); blank or missing means the engine's default. */
export const closureOptionsSchema = z.object({
  terminalAge: plainDecimal.optional(),
  fitFrom: plainDecimal.optional(),
  fitTo: plainDecimal.optional(),
}).strict()

const settings = {
  grid: benchGridSchema,
  transform: z.enum(TRANSFORM_IDS).default('none'),
  extrapolation: z.enum(EXTRAPOLATION_RULES).default('error'),
  extrapolationOptions: closureOptionsSchema.optional(),
  precision: z.number().int().min(6).max(60).optional(),
  money: moneyChoiceSchema.optional(),
}

export const compareSchema = z.object({
  ...settings,
  methods: z.array(methodChoiceSchema).min(1, { message: 'Choose at least one method' }).max(MAX_BENCH_METHODS, { message: `Compare at most ${MAX_BENCH_METHODS} methods at once` }),
  /** Label of the method the others are measured against (default: the first). */
  baseline: z.string().max(160).optional(),
  /** Chosen by the page to ask how far the run is (GET .../compare-progress/[run]). */
  runId: z.string().regex(/^[A-Za-z0-9-]{8,64}$/, { message: 'Not a run id' }).optional(),
})

export const saveFillSchema = z.object({
  ...settings,
  choice: methodChoiceSchema,
  rationale: z.string().trim().min(MIN_RATIONALE, { message: `Say why in at least ${MIN_RATIONALE} characters` }).max(4000),
  lockVersion: z.number().int().min(0),
})

export type BenchGrid = z.infer<typeof benchGridSchema>
export type MethodChoice = z.infer<typeof methodChoiceSchema>
export type CompareInput = z.infer<typeof compareSchema>
export type SaveFillInput = z.infer<typeof saveFillSchema>
