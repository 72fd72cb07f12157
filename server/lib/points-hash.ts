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
