import { TRANSFORMS } from './transforms'
import type { TransformListing } from './types'

export type { TransformListing }

/** What a client may show about the transforms. */
export const TRANSFORM_LISTING: readonly TransformListing[] = Object.values(TRANSFORMS).map(t => ({
  id: t.id,
  label: t.label,
  domain: t.domain,
  description: t.description,
}))
