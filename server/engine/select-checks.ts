import type { Dec, DecimalCtor } from './decimal'
import type { SelectCheck, TableKind } from './types'

/** A filled select table: rows xs, durations ds, values[i][j], ultimate[i] (attained age xs[i] + period). */
export interface SelectTable { xs: Dec[], ds: Dec[], values: Dec[][], ultimate: (Dec | null)[] | null, period: number | null }

const MAX_CELLS = 20
const cell = (x: Dec, d: Dec | null) => `${x.toString()}/${d === null ? 'ultimate' : d.toString()}`

/**
 * The ultimate value at attained age a: in the usual layout the ultimate column of row x holds q at age x + n
 * (n the select period), so age a is in row a - n (Dickson, Hardy and Waters, AMLCR, 2nd ed., section 3.7, select tables).
 */
function ultimateAt(t: SelectTable, age: Dec): Dec | null {
  if (!t.ultimate || t.period === null) return null
  const i = t.xs.findIndex(x => x.plus(t.period!).eq(age))
  return i < 0 ? null : t.ultimate[i]!
}

/** The checks a select-and-ultimate table needs; for other kinds the mortality-only ones say so (passed null). */
export function selectChecks(t: SelectTable, kind: TableKind, F: DecimalCtor): SelectCheck[] {
  return [belowUltimate(t, kind), rising(t, kind), smooth(t, 'rows'), smooth(t, 'columns'), ratio(t, kind, F)]
}

function notChecked(key: SelectCheck['key'], why: string): SelectCheck {
  return { key, passed: null, detail: why, cells: [] }
}

function reasonNotChecked(t: SelectTable, kind: TableKind): string | null {
  if (kind !== 'mortality') return 'Checked for mortality tables only (select lapse or salary tables have no such rule).'
  if (!t.ultimate) return 'The table has no ultimate column.'
  if (t.period === null) return 'The durations are not 0, 1, ..., n - 1, so the attained age of the ultimate column is not known.'
  return null
}

/** q_[x]+d <= q_{x+d}: selection lowers mortality below the ultimate rate at the same attained age (AMLCR 3.7). */
function belowUltimate(t: SelectTable, kind: TableKind): SelectCheck {
  const why = reasonNotChecked(t, kind)
  if (why) return notChecked('select-below-ultimate', why)
  const bad: string[] = []
  let compared = 0
  t.xs.forEach((x, i) => t.ds.forEach((d, j) => {
    const u = ultimateAt(t, x.plus(d))
    if (!u) return
    compared += 1
    if (t.values[i]![j]!.gt(u)) bad.push(cell(x, d))
  }))
  if (!compared) return notChecked('select-below-ultimate', 'No select cell has an ultimate value at the same attained age in the filled rows.')
  return { key: 'select-below-ultimate', passed: bad.length === 0, detail: bad.length ? `${bad.length} of ${compared} select rates lie above the ultimate rate at the same attained age.` : `All ${compared} select rates with an ultimate rate at the same attained age lie at or below it.`, cells: bad.slice(0, MAX_CELLS) }
}

/** Along each row the select rates do not fall with duration, and the last one does not pass the row's ultimate rate. */
function rising(t: SelectTable, kind: TableKind): SelectCheck {
  if (kind !== 'mortality') return notChecked('rising-with-duration', 'Checked for mortality tables only.')
  const bad: string[] = []
  t.xs.forEach((x, i) => {
    const row = t.values[i]!
    row.forEach((v, j) => { if (j > 0 && v.lt(row[j - 1]!)) bad.push(cell(x, t.ds[j]!)) })
    const u = t.ultimate?.[i]
    if (u && row.at(-1)!.gt(u)) bad.push(cell(x, null))
  })
  return { key: 'rising-with-duration', passed: bad.length === 0, detail: bad.length ? `${bad.length} cells fall with duration or pass the row's ultimate rate.` : 'In every row the select rates rise (or stay level) with duration toward the ultimate rate.', cells: bad.slice(0, MAX_CELLS) }
}

/**
 * No zig-zag along an axis: in each line (a column along x, or a row along d) the first differences change sign at most
 * once (common practice: an interpolant that oscillates shows as differences changing sign back and forth). The
 * figure is the largest absolute third difference on the line (the trade's smoothness measure, as in Whittaker-Henderson).
 */
function smooth(t: SelectTable, along: 'rows' | 'columns'): SelectCheck {
  const key = along === 'rows' ? 'smooth-rows' : 'smooth-columns'
  const lines: { values: Dec[], at: (k: number) => string }[] = along === 'rows'
    ? [...t.ds.map((d, j) => ({ values: t.xs.map((_, i) => t.values[i]![j]!), at: (k: number) => cell(t.xs[k]!, d) })),
        ...(t.ultimate && t.ultimate.every(u => u) ? [{ values: t.ultimate as Dec[], at: (k: number) => cell(t.xs[k]!, null) }] : [])]
    : t.xs.map((x, i) => ({ values: t.values[i]!, at: (k: number) => cell(x, t.ds[k]!) }))
  const bad: string[] = []
  let worst: Dec | null = null
  for (const line of lines) {
    const diff = line.values.slice(1).map((v, k) => v.minus(line.values[k]!))
    const signs = diff.map(v => v.cmp(0)).filter(s => s !== 0)
    const changes = signs.slice(1).filter((s, k) => s !== signs[k]).length
    if (changes > 1) bad.push(line.at(0))
    for (let k = 3; k < line.values.length; k += 1) {
      const v = line.values
      const d3 = v[k]!.minus(v[k - 1]!.times(3)).plus(v[k - 2]!.times(3)).minus(v[k - 3]!).abs()
      if (!worst || d3.gt(worst)) worst = d3
    }
  }
  const axis = along === 'rows' ? 'down each column (along the row axis)' : 'along each row (with duration)'
  const figure = worst ? ` Largest third difference ${axis}: ${worst.toSignificantDigits(6).toString()}.` : ''
  return { key, passed: bad.length === 0, detail: bad.length ? `${bad.length} lines ${axis} go up and down more than once.${figure}` : `No line ${axis} goes up and down more than once.${figure}`, cells: bad.slice(0, MAX_CELLS) }
}

/** q_[x]+d / q_{x+d} by duration: the range per duration; passes when the mean ratio does not fall with duration. */
function ratio(t: SelectTable, kind: TableKind, F: DecimalCtor): SelectCheck {
  const why = reasonNotChecked(t, kind)
  if (why) return notChecked('select-ratio', why)
  const parts: string[] = []
  const means: Dec[] = []
  t.ds.forEach((d, j) => {
    const rs = t.xs.map((x, i) => ({ v: t.values[i]![j]!, u: ultimateAt(t, x.plus(d)) })).filter(r => r.u && r.u.gt(0)).map(r => r.v.div(r.u!))
    if (!rs.length) return
    const lo = F.min(...rs)
    const hi = F.max(...rs)
    means.push(rs.reduce((a, b) => a.plus(b), new F(0)).div(rs.length))
    parts.push(`duration ${d.toString()}: ${lo.toSignificantDigits(3).toString()} to ${hi.toSignificantDigits(3).toString()}`)
  })
  if (!parts.length) return notChecked('select-ratio', 'No select cell has an ultimate value at the same attained age in the filled rows.')
  const falls = means.slice(1).some((m, k) => m.lt(means[k]!))
  return { key: 'select-ratio', passed: !falls, detail: `Select / ultimate at the same attained age, ${parts.join('; ')}${falls ? ' (the mean ratio falls with duration somewhere)' : ''}.`, cells: [] }
}
