// Curve tables state their compounding: set at import, changed in the table details while every version is a draft, passed
// to the engine by the bench (the result's spec records it), fixed once a version left draft. Smith-Wilson on the bench
// answers its calibrated alpha and convergence check (the engine's own, compared with a direct engine call).
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { fill } from '~~/server/engine/index'
import type { CompareResult } from '~~/server/engine/types'
import { Client, DEMO, LARKSPUR, closeOwnerDb, signedIn } from './helpers'
import { upload } from './import-helpers'

// a curve at standard tenors (domain brief); the rates are test data
const TENORS = ['1', '2', '3', '5', '7', '10', '15', '20']
const RATES = ['0.029', '0.03', '0.0305', '0.0315', '0.0322', '0.033', '0.0335', '0.033']
let actuary: Client
let table: string
const name = `Zz curve compounding ${Math.random().toString(36).slice(2, 8)}`

beforeAll(async () => {
  actuary = await signedIn(DEMO.actuary)
  const up = await upload(actuary, LARKSPUR, 'curve.csv', `Term,Spot rate\n${TENORS.map((t, i) => `${t},${RATES[i]}`).join('\n')}\n`)
  const mapping = { sheet: 'curve', headerRow: 0, axisColumn: 0, axis: 'term', axisUnit: 'years', columns: [{ index: 1, name, kind: 'spot-rate', valueUnit: 'per-unit', compounding: 'continuous' }] }
  const done = await actuary.post<{ tables: { id: string }[] }>(`/api/orgs/${LARKSPUR}/imports/${up.body.id}/commit`, { mapping })
  expect(done.status).toBe(201)
  table = `/api/orgs/${LARKSPUR}/tables/${done.body.tables[0]!.id}`
})
afterAll(closeOwnerDb)

describe('compounding of a curve table', () => {
  it('is set at import and changed in the table details while every version is a draft', async () => {
    expect((await actuary.get<{ compounding: string }>(table)).body.compounding).toBe('continuous')
    const r = await actuary.req<{ compounding: string }>('PATCH', table, { compounding: 'semi-annual' })
    expect(r.status).toBe(200)
    expect(r.body.compounding).toBe('semi-annual')
    expect((await actuary.req('PATCH', table, { compounding: 'monthly' })).status).toBe(400)
  })

  it('reaches the engine from the bench, and Smith-Wilson answers its calibrated alpha and convergence check', async () => {
    const body = { grid: { from: '1', to: '20', step: '1' }, methods: [{ method: 'monotone-convex' }, { method: 'smith-wilson', options: { ufr: '0.0345', alpha: 'auto' } }] }
    const r = await actuary.post<{ result: CompareResult, compounding: string }>(`${table}/versions/1/compare`, body)
    expect(r.status).toBe(200)
    expect(r.body.compounding).toBe('semi-annual')
    const [mc, sw] = r.body.result.entries
    expect(mc!.ok && sw!.ok).toBe(true)
    if (!mc!.ok || !sw!.ok) return
    expect(mc.result.spec.compounding).toBe('semi-annual')
    const knots = TENORS.map((x, i) => ({ x, y: RATES[i]! }))
    const direct = fill({ knots, kind: 'spot-rate', compounding: 'semi-annual', method: 'smith-wilson', options: { ufr: '0.0345', alpha: 'auto' }, grid: body.grid, extrapolation: 'error' })
    expect(sw.result.spec.options.alpha).toBe(direct.spec.options.alpha)
    expect(Number(sw.result.spec.options.alpha)).toBeGreaterThanOrEqual(0.05)
    expect(sw.result.diagnostics.convergence).toEqual(direct.diagnostics.convergence)
    expect(sw.result.diagnostics.convergence!.met).toBe(true)
  })
})
