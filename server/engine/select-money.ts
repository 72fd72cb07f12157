import { roundTo, type Dec, type DecimalCtor } from './decimal'
import { resolveMoneyOptions } from './money-options'
import type { SelectFillResult, SelectMoneyFigure, TableKind } from './types'
import type { SelectTable } from './select-checks'

type SelectMoney = SelectFillResult['money']

/**
 * The select-then-ultimate path of a life entering at age x: q_[x], q_[x]+1, ..., q_[x]+n-1 along row x, then the
 * ultimate column from row x down (attained ages x + n, x + n + 1, ...), as a select table is read (Dickson, Hardy and
 * Waters, AMLCR, 2nd ed., section 3.7). The ultimate-only path for comparison: q_x, q_{x+1}, ... from the ultimate column
 * of rows x - n, x - n + 1, .... Both stop after their last rate (the table is treated as closed there).
 */
function selectPath(t: SelectTable, i: number): Dec[] {
  return [...t.values[i]!, ...t.ultimate!.slice(i) as Dec[]]
}

function ultimatePath(t: SelectTable, age: Dec): Dec[] | null {
  const i = t.xs.findIndex(x => x.plus(t.period!).eq(age))
  return i < 0 ? null : t.ultimate!.slice(i) as Dec[]
}

/**
 * k p = prod (1 - q); annuity-due = sum_{k=0}^{L} v^k k p, curtate expectation = sum_{k=1}^{L} k p, v = 1 / (1 + i), over a
 * path of L rates (AMLCR sections 2.6 and 5.6: curtate expectation and whole life annuity-due, summed to the table's end).
 */
function pathFigures(q: Dec[], v: Dec, F: DecimalCtor): { annuity: Dec, expectation: Dec } {
  let p = new F(1)
  let vk = new F(1)
  let annuity = new F(1)
  let expectation = new F(0)
  for (const qk of q) {
    p = p.times(new F(1).minus(qk))
    vk = vk.times(v)
    annuity = annuity.plus(vk.times(p))
    expectation = expectation.plus(p)
  }
  return { annuity, expectation }
}

/** Figures rounded to the fill's stated precision P (F works at the working precision, precision.ts). */
export function selectMoney(t: SelectTable, kind: TableKind, raw: unknown, F: DecimalCtor, P: number): SelectMoney {
  const opts = resolveMoneyOptions(F, raw)
  const none = (note: string): SelectMoney => ({ interest: opts.interest, figures: [], note })
  if (kind !== 'mortality') return none('Money along the select-then-ultimate path is worked out for mortality tables only.')
  if (!t.ultimate || t.period === null) return none('Money needs an ultimate column and durations 0, 1, ..., n - 1.')
  const v = new F(1).div(new F(opts.interest).plus(1))
  const figures: SelectMoneyFigure[] = opts.ages.map((age) => {
    const i = t.xs.findIndex(x => x.eq(age))
    if (i < 0) return { age, selectAnnuity: null, ultimateAnnuity: null, selectExpectation: null, reason: `Entry age ${age} is not a filled row.` }
    const path = selectPath(t, i)
    if (path.some(q => q === null || q.lt(0) || q.gt(1))) return { age, selectAnnuity: null, ultimateAnnuity: null, selectExpectation: null, reason: `A rate on the path from age ${age} lies outside [0, 1].` }
    const sel = pathFigures(path, v, F)
    const up = ultimatePath(t, F.sum(age))
    const ult = up && up.every(q => q && q.gte(0) && q.lte(1)) ? pathFigures(up, v, F) : null
    return { age, selectAnnuity: roundTo(sel.annuity, P).toString(), ultimateAnnuity: ult ? roundTo(ult.annuity, P).toString() : null, selectExpectation: roundTo(sel.expectation, P).toString(), reason: ult ? null : `No ultimate rate at age ${age} in the filled rows, so no ultimate-only annuity to compare.` }
  })
  return { interest: opts.interest, figures, note: `Annuity-due and curtate expectation of a life entering at each age, select rates for ${t.period} years then ultimate; the ultimate-only annuity at the same age for comparison. Sums stop at the table's last row.` }
}
