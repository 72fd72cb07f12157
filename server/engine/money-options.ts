import { describeFailure, parseDecimal, quote, type DecimalCtor } from './decimal'
import { EngineError } from './errors'
import type { ResolvedMoneyOptions } from './types'

export const DEFAULT_MONEY: ResolvedMoneyOptions = {
  ages: [65],
  interest: '0.03',
  annuityTerms: [10, 20],
  keyTerms: ['1', '2', '5', '10', '20', '30'],
}

function wholeNumbers(value: unknown, name: string, min: number, max: number): number[] {
  if (!Array.isArray(value) || value.length === 0 || value.length > 50
    || !value.every(v => typeof v === 'number' && Number.isInteger(v) && v >= min && v <= max)) {
    throw new EngineError('invalid-request', `Money option ${name} must be a list of 1 to 50 whole numbers from ${min} to ${max}.`)
  }
  return [...new Set(value as number[])]
}

/** Validate the money options and fill in defaults (ages [65], interest 0.03, annuities of 10 and 20 years, key terms 1..30). */
export function resolveMoneyOptions(D: DecimalCtor, raw: unknown): ResolvedMoneyOptions {
  if (raw === undefined || raw === null) return { ...DEFAULT_MONEY, ages: [...DEFAULT_MONEY.ages], annuityTerms: [...DEFAULT_MONEY.annuityTerms], keyTerms: [...DEFAULT_MONEY.keyTerms] }
  if (typeof raw !== 'object') throw new EngineError('invalid-request', 'Money options must be an object.')
  const m = raw as Record<string, unknown>
  const ages = m.ages === undefined ? [...DEFAULT_MONEY.ages] : wholeNumbers(m.ages, 'ages', 0, 150)
  const annuityTerms = m.annuityTerms === undefined ? [...DEFAULT_MONEY.annuityTerms] : wholeNumbers(m.annuityTerms, 'annuityTerms', 1, 200)
  let interest = DEFAULT_MONEY.interest
  if (m.interest !== undefined) {
    const parsed = parseDecimal(D, m.interest)
    if (!parsed.ok) throw new EngineError('invalid-request', `Money interest ${quote(m.interest)} ${describeFailure(parsed.reason)}.`)
    if (!parsed.value.gt(-1)) throw new EngineError('invalid-request', 'Money interest must be greater than -1.')
    interest = parsed.value.toString()
  }
  let keyTerms = [...DEFAULT_MONEY.keyTerms]
  if (m.keyTerms !== undefined) {
    if (!Array.isArray(m.keyTerms) || m.keyTerms.length === 0 || m.keyTerms.length > 50) {
      throw new EngineError('invalid-request', 'Money keyTerms must be a list of 1 to 50 decimal strings.')
    }
    const terms = m.keyTerms.map((t: unknown) => {
      const parsed = parseDecimal(D, t)
      if (!parsed.ok) throw new EngineError('invalid-request', `Money key term ${quote(t)} ${describeFailure(parsed.reason)}.`)
      if (!parsed.value.gt(0)) throw new EngineError('invalid-request', `Money key term ${quote(t)} must be greater than 0.`)
      return parsed.value
    })
    terms.sort((a, b) => a.cmp(b))
    keyTerms = [...new Set(terms.map(t => t.toString()))]
  }
  return { ages, interest, annuityTerms, keyTerms }
}
