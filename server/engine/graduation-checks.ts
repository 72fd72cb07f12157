import { inverseDiagonal, type BandLDL } from './banded'
import { roundTo, sign, type Dec } from './decimal'
import { chiSquareTail, groupsPValue, signTestPValue } from './distributions'
import type { GraduationData } from './graduate'
import { READING_DIGITS } from './precision'
import type { GraduationDiagnostics, Located } from './types'

/** Standard normal probabilities of the bands below, from the standard normal table (common practice: the test of ISD counts). */
const BANDS = ['below -3', '-3 to -2', '-2 to -1', '-1 to 0', '0 to 1', '1 to 2', '2 to 3', 'above 3']
const NORMAL = ['0.00135', '0.02140', '0.13591', '0.34134', '0.34134', '0.13591', '0.02140', '0.00135']

interface Input {
  data: GraduationData
  /** Graduated values, rounded to the stated precision. */
  values: Dec[]
  F: BandLDL
  order: number
  precision: number
  exposureType: 'central' | 'initial'
}

/** sum (Δ^z v)^2 over consecutive values (Whittaker 1923's measure of roughness). */
function squaredDifferences(v: Dec[], z: number): Dec {
  let d = v
  for (let k = 0; k < z; k += 1) d = d.slice(1).map((x, i) => x.minus(d[i]!))
  return d.reduce((s, x) => s.plus(x.times(x)), v[0]!.times(0))
}

/**
 * The fit tests of a graduation (Forfar, McCutcheon and Wilkie, "On graduation by mathematical formula", JIA 115, 1988,
 * section 3; London 1985, ch. 2): standardised deviations z = (actual - expected deaths) / sqrt(variance), with expected deaths
 * E u and variance E u (central exposure, Poisson) or E u (1 - u) (initial exposure, binomial); chi-square = sum z^2 on
 * n - (effective parameters) degrees of freedom; the counts of z by band against the normal distribution; signs of the
 * deviations; grouping of signs; smoothness as sums of squared differences.
 */
export function graduationChecks(input: Input): GraduationDiagnostics {
  const { data, values, F, order, precision, exposureType } = input
  const { x, y, w, deaths, exposure } = data
  const zero = y[0]!.times(0)
  const notes: string[] = []
  // the hat matrix H = (W + h K'K)^-1 W: trace = sum_i w_i (A^-1)_ii
  const diag = inverseDiagonal(F)
  const effective = diag.reduce((s, zi, i) => s.plus(zi.times(w[i]!)), zero)
  let standardised = false
  let basis: string
  let raw: (Dec | null)[]
  if (deaths && exposure) {
    standardised = true
    basis = `(actual - expected deaths) / sqrt(variance), expected = exposure x graduated rate, variance ${exposureType === 'central' ? 'E u (Poisson, central exposure)' : 'E u (1 - u) (binomial, initial exposure)'}`
    raw = values.map((u, i) => {
      const expected = exposure[i]!.times(u)
      const variance = exposureType === 'central' ? expected : expected.times(u.neg().plus(1))
      return variance.gt(0) ? deaths[i]!.minus(expected).div(variance.sqrt()) : null
    })
    const undefinedAt = raw.flatMap((r, i) => (r === null ? [x[i]!.toString()] : []))
    if (undefinedAt.length) notes.push(`No standardised deviation where the expected variance is not positive (graduated rate at or below 0${exposureType === 'initial' ? ', or at or above 1' : ''}): x = ${undefinedAt.slice(0, 10).join(', ')}.`)
  }
  else {
    basis = 'sqrt(weight) x (crude - graduated); give deaths and exposure on every point for standardised deviations and the chi-square test'
    raw = values.map((u, i) => w[i]!.sqrt().times(y[i]!.minus(u)))
  }
  const deviations: Located[] = raw.flatMap((r, i) => (r === null ? [] : [{ x: x[i]!.toString(), value: roundTo(r, precision).toString() }]))
  // signs, from the deviations (a standardised deviation has the sign of crude - graduated)
  const signs = raw.map((r, i) => (r === null ? sign(y[i]!.minus(values[i]!)) : sign(r))).filter(s => s !== 0)
  const positive = signs.filter(s => s > 0).length
  const negative = signs.length - positive
  let runs = 0
  let positiveGroups = 0
  signs.forEach((s, k) => {
    if (k === 0 || s !== signs[k - 1]) {
      runs += 1
      if (s > 0) positiveGroups += 1
    }
  })
  let chiSquare: GraduationDiagnostics['chiSquare'] = null
  let distribution: GraduationDiagnostics['distribution'] = null
  if (standardised) {
    const zs = raw.filter((r): r is Dec => r !== null)
    const statistic = zs.reduce((s, r) => s.plus(r.times(r)), zero)
    const df = zero.plus(zs.length).minus(effective)
    chiSquare = {
      statistic: roundTo(statistic, precision).toString(),
      degreesOfFreedom: roundTo(df, precision).toString(),
      pValue: df.gt(0) ? readingOf(chiSquareTail(statistic.toNumber(), df.toNumber())) : 'n/a',
    }
    const observed = BANDS.map(() => 0)
    for (const r of zs) {
      const v = r.toNumber()
      observed[v < -3 ? 0 : v < -2 ? 1 : v < -1 ? 2 : v < 0 ? 3 : v < 1 ? 4 : v < 2 ? 5 : v < 3 ? 6 : 7]! += 1
    }
    distribution = { bands: [...BANDS], observed, expected: NORMAL.map(p => roundTo(zero.plus(p).times(zs.length), READING_DIGITS).toString()) }
  }
  const fit = values.reduce((s, u, i) => s.plus(w[i]!.times(u.minus(y[i]!).pow(2))), zero)
  return {
    fit: roundTo(fit, precision).toString(),
    smoothness: {
      order,
      graduated: roundTo(squaredDifferences(values, order), precision).toString(),
      crude: roundTo(squaredDifferences(y, order), precision).toString(),
      thirdDifferences: roundTo(squaredDifferences(values, 3), precision).toString(),
    },
    effectiveParameters: roundTo(effective, precision).toString(),
    deviations: { basis, standardised, values: deviations },
    chiSquare,
    distribution,
    signs: { positive, negative, pValue: signTestPValue(positive, negative) },
    runs: { runs, positiveGroups, pValue: groupsPValue(positive, negative, positiveGroups) },
    notes,
  }
}

function readingOf(p: number): string {
  if (!Number.isFinite(p)) return 'n/a'
  return Number(Math.min(1, Math.max(0, p)).toPrecision(READING_DIGITS)).toString()
}
