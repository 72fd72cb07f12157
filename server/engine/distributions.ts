import { READING_DIGITS, readingContext } from './precision'

/**
 * Probabilities for the graduation tests. Exact where the distribution is discrete (binomial coefficients on BigInt, then
 * one division); the chi-square tail in binary floating point, because a test probability is a reading at 4 significant
 * digits, not a table value (precision.ts).
 */

const binomials = new Map<string, bigint>()

/** C(n, k) exactly. */
export function binomial(n: number, k: number): bigint {
  if (k < 0 || k > n) return 0n
  const kk = Math.min(k, n - k)
  const key = `${n}:${kk}`
  let c = binomials.get(key)
  if (c === undefined) {
    c = 1n
    for (let j = 1; j <= kk; j += 1) c = c * BigInt(n - kk + j) / BigInt(j)
    if (binomials.size < 10_000) binomials.set(key, c)
  }
  return c
}

/** num / den (den > 0) as a reading: READING_DIGITS significant digits (precision.ts), at most 1. */
export function ratioText(num: bigint, den: bigint): string {
  if (num >= den) return '1'
  const D = readingContext()
  return new D(num.toString()).div(den.toString()).toSignificantDigits(READING_DIGITS).toString()
}

/** Two-sided sign test: P(X <= min) + P(X >= max) for X ~ Binomial(n, 1/2) (at most 1). */
export function signTestPValue(positive: number, negative: number): string {
  const n = positive + negative
  if (n === 0) return '1'
  const m = Math.min(positive, negative)
  let tail = 0n
  for (let k = 0; k <= m; k += 1) tail += binomial(n, k)
  const num = 2n * tail
  const den = 2n ** BigInt(n)
  return num >= den ? '1' : ratioText(num, den)
}

/**
 * Grouping of signs: with n1 positive and n2 negative deviations in random order, the number G of runs of positives has
 * P(G = t) = C(n1 - 1, t - 1) C(n2 + 1, t) / C(n1 + n2, n1) (Stevens 1939; Forfar, McCutcheon and Wilkie 1988, the
 * grouping of signs test). Returns P(G <= g): small when the deviations clump into too few groups.
 */
export function groupsPValue(n1: number, n2: number, g: number): string {
  if (n1 === 0 || n2 === 0) return '1'
  let num = 0n
  for (let t = 1; t <= g; t += 1) num += binomial(n1 - 1, t - 1) * binomial(n2 + 1, t)
  return ratioText(num, binomial(n1 + n2, n1))
}

/** ln Gamma(x), x > 0 (Lanczos; Press et al., Numerical Recipes in C, 2nd ed., 1992, 6.1 gammln). */
function lnGamma(x: number): number {
  // Numerical Recipes' digits, written as the doubles they become
  const cof = [76.18009172947146, -86.50532032941678, 24.01409824083091, -1.231739572450155, 0.1208650973866179e-2, -0.5395239384953e-5]
  let y = x
  const tmp = x + 5.5 - (x + 0.5) * Math.log(x + 5.5)
  let ser = 1.000000000190015
  for (const c of cof) ser += c / (y += 1)
  return -tmp + Math.log(2.5066282746310007 * ser / x)
}

/** Upper tail of chi-square with df degrees of freedom at x: Q(df/2, x/2) (Numerical Recipes, 2nd ed., 6.2 gammq: series below a + 1, continued fraction above). */
export function chiSquareTail(x: number, df: number): number {
  if (!(df > 0)) return Number.NaN
  if (x <= 0) return 1
  const a = df / 2
  const z = x / 2
  const front = Math.exp(-z + a * Math.log(z) - lnGamma(a))
  if (z < a + 1) {
    let sum = 1 / a
    let term = sum
    for (let n = 1; n < 1000; n += 1) {
      term *= z / (a + n)
      sum += term
      if (Math.abs(term) < Math.abs(sum) * 1e-15) break
    }
    return 1 - sum * front
  }
  // Lentz's continued fraction for Q
  const tiny = 1e-300
  let b = z + 1 - a
  let c = 1 / tiny
  let d = 1 / b
  let h = d
  for (let i = 1; i < 1000; i += 1) {
    const an = -i * (i - a)
    b += 2
    d = an * d + b
    if (Math.abs(d) < tiny) d = tiny
    c = b + an / c
    if (Math.abs(c) < tiny) c = tiny
    d = 1 / d
    const del = d * c
    h *= del
    if (Math.abs(del - 1) < 1e-15) break
  }
  return front * h
}
