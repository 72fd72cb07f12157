// Messages a user acts on: each names the point and the reason. Source: the wording (e.g. "Point 3 (x = 45): y 'abc' is not a number").
import { describe, expect, it } from 'vitest'
import { fill, type FillRequest } from '~~/server/engine'
import { T, engineErrorOf as errorOf, knots } from './helpers'

const grid = { from: '20', to: '40', step: '5' }
const base: FillRequest = { knots: knots([20, 30, 45], ['0.001', '0.002', '0.004']), method: 'linear', grid: { from: '20', to: '45', step: '5' } }

describe('engine errors', () => {
  it('names a non-numeric y by position and x', () => {
    const e = errorOf({ ...base, knots: knots([20, 30, 45], ['0.001', '0.002', 'abc']) })
    expect(e.message).toBe("Point 3 (x = 45): y 'abc' is not a number.")
    expect(e.code).toBe('invalid-knot')
    expect(e.point).toBe(3)
  })
  it('names a non-numeric x', () => {
    expect(errorOf({ ...base, knots: knots([20, 'forty', 45], ['0.001', '0.002', '0.003']) }).message).toBe("Point 2: x 'forty' is not a number.")
  })
  it('refuses non-finite values and JS numbers', () => {
    expect(errorOf({ ...base, knots: knots([20, 30, 45], ['0.001', 'Infinity', '0.003']) }).message).toBe("Point 2 (x = 30): y 'Infinity' is not finite.")
    expect(errorOf({ ...base, knots: knots([20, 30, 45], ['0.001', 'NaN', '0.003']) }).message).toContain('is not finite')
    expect(errorOf({ ...base, knots: [{ x: '20', y: 0.1 as unknown as string }, { x: '30', y: '0.2' }] }).message).toContain('must be given as a decimal string')
    expect(errorOf({ ...base, knots: knots([20, '0x1F', 45], ['0.001', '0.002', '0.003']) }).message).toContain('is not a number')
  })
  it('names both points of a duplicate x, after sorting', () => {
    const e = errorOf({ ...base, knots: knots([45, 20, '45.0'], ['0.004', '0.001', '0.005']) })
    expect(e.message).toBe('Points 1 and 3 have the same x = 45; each x may appear once.')
    expect(e.code).toBe('duplicate-x')
  })
  it('refuses too few points', () => {
    const e = errorOf({ ...base, method: 'cubic-natural', knots: knots([20], ['0.001']) })
    expect(e.code).toBe('too-few-points')
    expect(e.message).toBe('Method cubic-natural needs at least 2 points; 1 was given.')
  })
  it('names the first grid point outside the knots when extrapolation is error', () => {
    const e = errorOf({ ...base, grid: { from: '15', to: '50', step: '5' } })
    expect(e.code).toBe('outside-knots')
    expect(e.message).toBe("Grid point 1 (x = 15) lies outside the knots [20, 45] and extrapolation is 'error'; choose 'flat' or 'linear' extrapolation, or keep the points inside the knots.")
    const e2 = errorOf({ ...base, grid: undefined, at: ['30', '50', '10'] })
    expect(e2.message).toContain('Requested point 2 (x = 50)')
  })
  it('extrapolates flat and linear when asked', () => {
    const flat = fill({ ...base, grid: { from: '10', to: '55', step: '5' }, extrapolation: 'flat' })
    expect(flat.points[0]).toEqual({ x: '10', y: '0.001' })
    expect(flat.points.at(-1)).toEqual({ x: '55', y: '0.004' })
    const lin = fill({ ...base, grid: { from: '10', to: '55', step: '5' }, extrapolation: 'linear' })
    expect(lin.points[0]).toEqual({ x: '10', y: '0' }) // 0.001 - 10 * 0.0001
    expect(lin.points.at(-1)).toEqual({ x: '55', y: '0.005333333333333333333333333333333333333333' }) // 0.004 + 10 * 0.002/15
    expect(lin.diagnostics.notes.join(' ')).toContain('4 point(s) lie outside the given points, 20 to 45 (2 below, 2 above); there the fill is the end piece extended as a straight line')
  })
  it('linear extrapolation of a cubic continues the end piece\'s slope (natural spline: s\'\'(x_n) = 0, so the slope matches to second order)', () => {
    const kn = knots([0, 1, 2, 4], ['1', '3', '2', '5'])
    const r = fill({ knots: kn, method: 'cubic-natural', at: ['3.999999', '4', '5', '6', '-1', '0'], extrapolation: 'linear', precision: 30 })
    const [near, end, a, b, l1, start] = r.points.map(p => new T(p.y))
    expect(end!.toString()).toBe('5')
    expect(b!.minus(a!).minus(a!.minus(end!)).abs().lt('1e-27')).toBe(true) // straight beyond the end (to rounding at 30 digits)
    // slope from the last piece: (y(4) - y(4 - 1e-6)) / 1e-6 agrees with the extrapolated slope to ~1e-6 (s'' = 0 at the end)
    expect(end!.minus(near!).div('1e-6').minus(a!.minus(end!)).abs().lt('1e-5')).toBe(true)
    expect(start!.toString()).toBe('1')
    expect(l1!.lt(start!) || l1!.gt(start!)).toBe(true)
  })

  it('refuses unknown methods, options, transforms and bad option values', () => {
    expect(errorOf({ ...base, method: 'spline' as never }).code).toBe('unknown-method')
    expect(errorOf({ ...base, options: { tension: '1' } }).message).toBe('Method linear has no option \'tension\'; it takes none.')
    expect(errorOf({ ...base, method: 'quadratic', options: { condition: 'middle' } }).code).toBe('invalid-option')
    expect(errorOf({ ...base, method: 'cubic-clamped', options: { startSlope: 'steep' } }).message).toBe("Option startSlope of cubic-clamped: 'steep' is not a number.")
    expect(errorOf({ ...base, transform: 'sqrt' as never }).message).toContain('Unknown transform')
    expect(errorOf({ ...base, precision: 3 }).code).toBe('invalid-request')
  })
  it('refuses values outside a transform domain, naming the point', () => {
    const e = errorOf({ ...base, method: 'log-linear', knots: knots([20, 30, 45], ['0.001', '0', '0.004']) })
    expect(e.message).toBe("Point 2 (x = 30): y '0' is outside the domain; log-linear needs y > 0.")
    expect(errorOf({ ...base, transform: 'logit', knots: knots([20, 30, 45], ['0.001', '1', '0.004']) }).message).toContain('needs 0 < y < 1')
    expect(errorOf({ ...base, method: 'log-linear', transform: 'log' }).message).toContain('already interpolates ln y')
  })
  it('refuses a bad grid', () => {
    expect(errorOf({ ...base, grid: { from: '20', to: '40', step: '0' } }).code).toBe('invalid-grid')
    expect(errorOf({ ...base, grid: { from: '40', to: '20', step: '1' } }).code).toBe('invalid-grid')
    expect(errorOf({ ...base, grid, at: ['25'] }).code).toBe('invalid-grid')
    expect(errorOf({ ...base, grid: { from: '0', to: '1e9', step: '1' } }).message).toContain('at most')
  })
})
