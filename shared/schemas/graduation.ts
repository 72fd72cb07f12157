import { z } from '#shared/zod'
import { MIN_RATIONALE } from '../fills'
import type { TableKind } from '../tables'

// The graduate step (Whittaker-Henderson): the settings a person tries, then the same settings made a new working draft.

/** Kinds whose values are rates estimated from experience; a curve is fitted to prices, not graduated. */
export const GRADUATED_KINDS: readonly TableKind[] = ['mortality', 'lapse', 'salary', 'other']
export const GRADUATION_ORDERS = [1, 2, 3, 4, 5, 6] as const
export const DEFAULT_GRADUATION = { order: 3, smoothing: '100', digits: 10, exposureType: 'central' } as const

export const graduationSettingsSchema = z.object({
  /** z: the order of the differences whose squares are penalised (Whittaker's choice was 3). */
  order: z.number().int().min(1, { message: 'Choose an order from 1 to 6' }).max(6, { message: 'Choose an order from 1 to 6' }).default(3),
  /** h >= 0: how much smoothness counts against closeness to the crude rates. */
  smoothing: z.string().trim().regex(/^\d+(\.\d+)?$/, { message: 'Enter a smoothing of 0 or more, like 100 or 2.5' }).max(30),
  /** Significant digits of the graduated values (the draft keeps them as given here). */
  digits: z.number().int().min(6, { message: 'Keep 6 to 40 significant digits' }).max(40, { message: 'Keep 6 to 40 significant digits' }).default(10),
  /** With imported exposures and deaths: exposure as years lived (central, Poisson deaths) or lives at the start of the year (initial, binomial). */
  exposureType: z.enum(['central', 'initial']).default('central'),
})

export const graduatedDraftSchema = graduationSettingsSchema.extend({
  rationale: z.string().trim().min(MIN_RATIONALE, { message: `Say why in at least ${MIN_RATIONALE} characters` }).max(4000),
  /** The source version's lock version when the graduation was looked at: a change since then gets 409. */
  lockVersion: z.number().int().min(0),
})

export type GraduationSettings = z.infer<typeof graduationSettingsSchema>
export type GraduatedDraftInput = z.infer<typeof graduatedDraftSchema>
