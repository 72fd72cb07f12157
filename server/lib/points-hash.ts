import { createHash } from 'node:crypto'
import { canonicalDecimal, cmpDecimal } from '#shared/decimal-text'

/**
 * Content hash of a version: SHA-256 (hex) of the points sorted by x, one line per point,
 * "x<TAB>y\n", each number in canonical decimal text (shared/decimal-text.ts canonicalDecimal:
 * plain notation, no exponent, no trailing zeros, no '+', '-0' as '0'). So "65.0 / 0.01230" and
 * "65 / 0.0123" hash alike, and the hash does not depend on row order or on how PostgreSQL
 * prints NUMERIC.
 */
export function pointsContentHash(points: { x: string; y: string }[]): string {
  const lines = points
    .map(p => ({ x: canonicalDecimal(p.x), y: canonicalDecimal(p.y) }))
    .sort((a, b) => cmpDecimal(a.x, b.x))
    .map(p => `${p.x}\t${p.y}\n`)
  return createHash('sha256').update(lines.join('')).digest('hex')
}

/** A two-way cell: row axis x, column axis d (null for the ultimate column), value y. */
export interface GridCell { x: string; d: string | null; y: string }

/** Cells in the order the content hash and every listing use: by x, then by d, the ultimate column last. */
export function sortCells<T extends { x: string; d: string | null }>(cells: T[]): T[] {
  return [...cells].sort((a, b) => cmpDecimal(a.x, b.x) || (a.d === null ? (b.d === null ? 0 : 1) : b.d === null ? -1 : cmpDecimal(a.d, b.d)))
}

/**
 * Content hash of a two-way version: SHA-256 (hex) of its cells in sortCells order, one line "x<TAB>d<TAB>y\n" in
 * canonical decimal text, d written "ult" for the ultimate column. Three fields per line, so it never equals a one-way
 * hash of the same numbers; kw_points_hash (migration 1201) computes the same in SQL.
 */
export function gridContentHash(cells: GridCell[]): string {
  const lines = sortCells(cells.map(c => ({ x: canonicalDecimal(c.x), d: c.d === null ? null : canonicalDecimal(c.d), y: canonicalDecimal(c.y) })))
    .map(c => `${c.x}\t${c.d ?? 'ult'}\t${c.y}\n`)
  return createHash('sha256').update(lines.join('')).digest('hex')
}
