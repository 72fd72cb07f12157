/**
 * Exact rational numbers on BigInt, for the coefficients of formulas defined by conditions (the osculatory methods):
 * they are derived once, exactly, when the module loads, and only the final weights meet decimal arithmetic.
 */
export class Rational {
  readonly n: bigint
  readonly d: bigint

  constructor(n: bigint, d: bigint = 1n) {
    if (d === 0n) throw new Error('Rational: zero denominator')
    if (d < 0n) { n = -n; d = -d }
    const g = gcd(n < 0n ? -n : n, d)
    this.n = g > 1n ? n / g : n
    this.d = g > 1n ? d / g : d
  }

  static of(value: number | bigint | string): Rational {
    if (typeof value === 'bigint') return new Rational(value)
    if (typeof value === 'number') {
      if (!Number.isInteger(value)) throw new Error('Rational.of: give fractions as text, e.g. "117/10000" or "0.0117"')
      return new Rational(BigInt(value))
    }
    const fraction = /^(-?\d+)\/(\d+)$/.exec(value)
    if (fraction) return new Rational(BigInt(fraction[1]!), BigInt(fraction[2]!))
    const dec = /^(-?)(\d+)(?:\.(\d+))?$/.exec(value)
    if (!dec) throw new Error(`Rational.of: not a fraction or decimal: ${value}`)
    const places = dec[3]?.length ?? 0
    return new Rational(BigInt(`${dec[1]}${dec[2]}${dec[3] ?? ''}`), 10n ** BigInt(places))
  }

  plus(o: Rational): Rational { return new Rational(this.n * o.d + o.n * this.d, this.d * o.d) }
  minus(o: Rational): Rational { return new Rational(this.n * o.d - o.n * this.d, this.d * o.d) }
  times(o: Rational): Rational { return new Rational(this.n * o.n, this.d * o.d) }
  div(o: Rational): Rational { return new Rational(this.n * o.d, this.d * o.n) }
  isZero(): boolean { return this.n === 0n }
  eq(o: Rational): boolean { return this.n === o.n && this.d === o.d }
  toString(): string { return this.d === 1n ? this.n.toString() : `${this.n}/${this.d}` }
}

export const ZERO = new Rational(0n)
export const ONE = new Rational(1n)

function gcd(a: bigint, b: bigint): bigint {
  while (b !== 0n) [a, b] = [b, a % b]
  return a === 0n ? 1n : a
}

/** (s0)^k as a rational, s0 rational. */
export function power(s: Rational, k: number): Rational {
  let out = ONE
  for (let i = 0; i < k; i += 1) out = out.times(s)
  return out
}

/**
 * Solve A z = B exactly, A square and non-singular, B with any number of columns (Gauss-Jordan elimination with a
 * non-zero pivot; exact arithmetic needs no pivoting for size). Returns Z with the columns of B.
 */
export function solveExact(A: Rational[][], B: Rational[][]): Rational[][] {
  const n = A.length
  const M = A.map((row, i) => [...row, ...B[i]!])
  for (let c = 0; c < n; c += 1) {
    const p = M.findIndex((row, r) => r >= c && !row[c]!.isZero())
    if (p < 0) throw new Error('solveExact: singular system')
    ;[M[c], M[p]] = [M[p]!, M[c]!]
    const pivot = M[c]![c]!
    M[c] = M[c]!.map(v => v.div(pivot))
    for (let r = 0; r < n; r += 1) {
      if (r === c || M[r]![c]!.isZero()) continue
      const f = M[r]![c]!
      M[r] = M[r]!.map((v, k) => v.minus(f.times(M[c]![k]!)))
    }
  }
  return M.map(row => row.slice(n))
}
