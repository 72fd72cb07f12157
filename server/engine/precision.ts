import { decimalContext, quote, type DecimalCtor } from './decimal'
import { EngineError } from './errors'
import { DEFAULT_PRECISION, MAX_PRECISION, MIN_PRECISION } from './types'

/**
 * The engine's one precision budget. Every context and every floating-point shortcut of the engine derives from here;
 * docs/methods.md ("Precision budget") explains each line.
 *
 * A request states p significant digits (DEFAULT_PRECISION 40, MIN 6, MAX 200; the numbers live in the import-free
 * shared/engine/contract.ts so shared code can read them). The engine carries W = p + GUARD_DIGITS digits and rounds
 * every result once, half-even, to p. The guard digits are spent as follows (an error of k digits means a relative
 * error up to 10^k units of the working precision, relative to the largest value on the scale where the step works):
 *   - parsing: 0 (decimal.js keeps every digit of a decimal string; nothing is rounded);
 *   - fit (solving for a method's coefficients, with up to 10,000 knots): at most FIT_DIGITS = 6. Each of the O(n)
 *     operations on one coefficient's path rounds once (at most n <= 10^4 roundings, 4 digits); the linear systems are
 *     diagonally dominant or have positive pivots (condition under 10, 1 digit); 1 digit headroom;
 *   - evaluation of the pieces: 0 (exact, on scaled integers; evaluate.ts);
 *   - inverse transform (exp, ln at W): at most TRANSFORM_DIGITS = 2 (exp and ln are faithfully rounded, and an absolute
 *     error e in v becomes a relative error e in exp(v): |v| < 100 on any table costs 2 digits);
 *   - graduation (graduate.ts): a band solve of (W + h K'K) u = W y loses up to log10(condition) digits, which a large h
 *     makes large; iterative refinement (the residual formed in residualPrecision(W) digits, the correction from the same factors) recovers them until the
 *     correction is below 10^-(p + MARGIN_DIGITS + 1) of the largest value, or refuses as ill-conditioned;
 *   - sums over a table in the money view (l_x products, annuity sums, up to 1,000 terms): at most 4, inside the same budget;
 *   - dense solves of a matrix that may be ill-conditioned (Smith-Wilson's Wilson matrix, smith-wilson.ts): solved at
 *     W + DENSE_SOLVE_DIGITS = W + 20, which absorbs a condition number up to 10^20 (measured: 10^6 to 10^8 for annual
 *     terms, about 10^10 for monthly terms to 10 years, alpha 0.05 to 0.5), then rounded into the working context;
 *   - a calibration search (Smith-Wilson's alpha) decides each step in searchPrecision() digits: a reading of the
 *     criterion to READING_DIGITS with the guard digits, its dense solve with DENSE_SOLVE_DIGITS; the answer is confirmed
 *     at the full precision and searched again there if the confirmation fails, so the result does not depend on it;
 *   - a two-way fill (fill2d.ts) is two one-way passes: the pass along x is stated at W (intermediate values keep all the
 *     guard digits of the final pass) and so runs in workingContext(W); the pass along d rounds to p;
 *   - elementary functions carry ELEMENTARY_GUARD_DIGITS = 5 while they iterate (ln.ts), and return faithfully rounded
 *     values at their context's precision;
 *   - what is left, MARGIN_DIGITS = 2, keeps the error before the final rounding below 10^-(p+2) of the scale, so each
 *     result is within half a unit in its last place plus 10^-(p+2) (relative to the largest value on the fit's scale)
 *     of what the method gives in exact arithmetic. tests/unit/engine/precision.test.ts checks this against runs at p + 60.
 */
export const FIT_DIGITS = 6
export const TRANSFORM_DIGITS = 2
export const MARGIN_DIGITS = 2
export const GUARD_DIGITS = FIT_DIGITS + TRANSFORM_DIGITS + MARGIN_DIGITS

export { DEFAULT_PRECISION, MAX_PRECISION, MIN_PRECISION }

/** Digits the engine carries for a request of p significant digits. */
export function workingPrecision(p: number): number {
  return p + GUARD_DIGITS
}

/** The decimal context of a request of p significant digits. */
export function workingContext(p: number): DecimalCtor {
  return decimalContext(workingPrecision(p))
}

/** Extra digits of a dense solve whose matrix may be ill-conditioned (see above): up to a condition number of 10^20. */
export const DENSE_SOLVE_DIGITS = 20
/** Digits a dense solve runs at for results wanted at `digits`. */
export function denseSolvePrecision(digits: number): number {
  return digits + DENSE_SOLVE_DIGITS
}

/**
 * Digits in which a residual b - A u of numbers held to `digits` is formed before it is rounded back (the graduation's
 * iterative refinement, banded.ts): each product of two such numbers is exact in twice the digits, so only the few sums
 * along a band row round, far below the correction being sought.
 */
export function residualPrecision(digits: number): number {
  return 2 * digits
}

/** Digits carried by an elementary function (ln) while it iterates, beyond its result's. */
export const ELEMENTARY_GUARD_DIGITS = 5

/** The stated precision of a request, validated (default DEFAULT_PRECISION). */
export function resolvePrecision(value: unknown): number {
  if (value === undefined || value === null) return DEFAULT_PRECISION
  if (typeof value !== 'number' || !Number.isInteger(value) || value < MIN_PRECISION || value > MAX_PRECISION) {
    throw new EngineError('invalid-request', `Precision must be a whole number of significant digits from ${MIN_PRECISION} to ${MAX_PRECISION}; got ${quote(value)}.`)
  }
  return value
}

/**
 * Binary floating point appears only to rank and shortlist (compare's largest difference, the forward-rate scan), never in
 * a reported figure. Its bounds derive from the unit roundoff of IEEE 754 binary64, u = 2^-53: every conversion of a
 * decimal to a double and every basic operation is exact up to a factor (1 + d), |d| <= u (Higham, Accuracy and Stability
 * of Numerical Algorithms, 2nd ed., 2002, section 2.2, the standard model). Math.log and Math.log1p are taken as within
 * 2 units (fdlibm documents less than 1 ulp).
 */
export const UNIT_ROUNDOFF = 2 ** -53
/** Below this magnitude a double may be subnormal and the standard model's relative bound fails: add it as an absolute slack. */
export const FLOAT_TINY = Number.MIN_VALUE * 2 ** 60

/**
 * Test probabilities (the graduation's chi-square, signs and groups tests) are readings, reported to READING_DIGITS
 * significant digits: the discrete ones from exact integer counts with one division in readingContext(), the chi-square
 * tail in binary floating point (its series and continued fraction converge to about 1e-15, far below the digits shown).
 */
export const READING_DIGITS = 4
export function readingContext(): DecimalCtor {
  return decimalContext(READING_DIGITS + GUARD_DIGITS)
}

/** Digits of each step of a calibration search (a reading of its criterion, solved densely); the answer is confirmed at W. */
export function searchPrecision(): number {
  return denseSolvePrecision(READING_DIGITS + GUARD_DIGITS)
}
