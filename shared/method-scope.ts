// Where a method applies on the bench: the table kinds it is meant for and the spacing of the given points it needs, read
// from the engine's listing (appliesTo, minPoints), so the bench offers a method only where the engine would take it and
// says in words why another is not offered.
import type { MethodListing, TableKind } from './engine/contract'
import { D } from './decimal-text'
import { KIND_LABELS } from './tables'

/** True when every step between consecutive x (ascending) is the same, exactly (decimal arithmetic). */
export function equallySpaced(xs: readonly string[]): boolean {
  if (xs.length < 3) return true
  const step = new D(xs[1]!).minus(xs[0]!)
  for (let i = 2; i < xs.length; i += 1) if (!new D(xs[i]!).minus(xs[i - 1]!).eq(step)) return false
  return true
}

export type Scope = { offered: true } | { offered: false, reason: string }

/** Whether the bench offers `listing` for a table of `kind` with given points at `xs`, and if not, why (in words). */
export function methodScope(listing: MethodListing, kind: TableKind, xs: readonly string[]): Scope {
  if (!listing.appliesTo.kinds.includes(kind)) {
    return { offered: false, reason: `meant for ${listing.appliesTo.kinds.map(k => KIND_LABELS[k].toLowerCase()).join(', ')} tables` }
  }
  if (xs.length < listing.minPoints) return { offered: false, reason: `needs at least ${listing.minPoints} given points (this version has ${xs.length})` }
  if (listing.appliesTo.spacing === 'equal' && !equallySpaced(xs)) return { offered: false, reason: 'needs equally spaced given points (these are not)' }
  return { offered: true }
}

/** The listings the bench offers here, in the listing's order. */
export function offeredMethods(listings: readonly MethodListing[], kind: TableKind, xs: readonly string[]): MethodListing[] {
  return listings.filter(l => methodScope(l, kind, xs).offered)
}
