import { describe, expect, it } from 'vitest'
import { METHOD_IDS } from '#shared/engine/contract'
import type { CompareResponseDto } from '#shared/types/fills'
import { SERIES_COLOURS, SERIES_MIN_DISTANCE, methodStyle } from '~~/utils/series-style'
import { differenceSeries, forwardSeries, valueSeries } from '~~/utils/bench-series'

// Colour-vision deficiency simulation: Machado, Oliveira and Fernandes (2009), "A physiologically-based model for
// simulation of color vision deficiency", IEEE TVCG 15(6), table of matrices at severity 1.0, applied to linear RGB.
const PROTANOPIA = [[0.152286, 1.052583, -0.204868], [0.114503, 0.786281, 0.099216], [-0.003882, -0.048116, 1.051998]]
const DEUTERANOPIA = [[0.367322, 0.860646, -0.227968], [0.280085, 0.672501, 0.047413], [-0.011820, 0.042940, 0.968881]]
// sRGB to linear and to CIE XYZ (D65) and CIELAB: IEC 61966-2-1 and CIE 15:2004.
const linear = (c: number) => (c <= 0.04045 ? c / 12.92 : ((c + 0.055) / 1.055) ** 2.4)
const rgb = (hex: string) => [1, 3, 5].map(i => linear(parseInt(hex.slice(i, i + 2), 16) / 255))
const apply = (m: number[][], v: number[]) => m.map(r => Math.min(1, Math.max(0, r[0]! * v[0]! + r[1]! * v[1]! + r[2]! * v[2]!)))
function lab([r, g, b]: number[]): number[] {
  const f = (t: number) => (t > 216 / 24389 ? Math.cbrt(t) : (24389 / 27 * t + 16) / 116)
  const X = (0.4124 * r! + 0.3576 * g! + 0.1805 * b!) / 0.95047
  const Y = 0.2126 * r! + 0.7152 * g! + 0.0722 * b!
  const Z = (0.0193 * r! + 0.1192 * g! + 0.9505 * b!) / 1.08883
  return [116 * f(Y) - 16, 500 * (f(X) - f(Y)), 200 * (f(Y) - f(Z))]
}
const deltaE = (a: number[], b: number[]) => Math.hypot(a[0]! - b[0]!, a[1]! - b[1]!, a[2]! - b[2]!)
const luminance = (hex: string) => { const [r, g, b] = rgb(hex); return 0.2126 * r! + 0.7152 * g! + 0.0722 * b! }
const contrast = (a: string, b: string) => { const [hi, lo] = [luminance(a), luminance(b)].sort((x, y) => y - x); return (hi! + 0.05) / (lo! + 0.05) }

describe('series colours', () => {
  it.each([['normal vision', null], ['protanopia', PROTANOPIA], ['deuteranopia', DEUTERANOPIA]] as const)('the 8 colours are pairwise at least ΔE %s apart', (_, m) => {
    const seen = SERIES_COLOURS.map(h => lab(m ? apply(m as number[][], rgb(h)) : rgb(h)))
    for (let i = 0; i < seen.length; i += 1) {
      for (let j = i + 1; j < seen.length; j += 1) expect(deltaE(seen[i]!, seen[j]!), `${SERIES_COLOURS[i]} / ${SERIES_COLOURS[j]}`).toBeGreaterThanOrEqual(SERIES_MIN_DISTANCE)
    }
  })
  it('each colour has 3:1 contrast on white and on the dark page (WCAG 2.1 1.4.11)', () => {
    for (const c of SERIES_COLOURS) {
      expect(contrast(c, '#ffffff'), c).toBeGreaterThanOrEqual(3)
      expect(contrast(c, '#1b1f1d'), c).toBeGreaterThanOrEqual(3)
    }
  })
  it('no two methods share both colour and dash; the first 8 methods have 8 colours', () => {
    const keys = METHOD_IDS.map(m => `${methodStyle(m).colour} ${methodStyle(m).dashIndex}`)
    expect(new Set(keys).size).toBe(METHOD_IDS.length)
    expect(new Set(METHOD_IDS.slice(0, 8).map(m => methodStyle(m).colour)).size).toBe(8)
  })
})

function entry(label: string, method: string, ys: number[]) {
  return { label, ok: true, result: { spec: { method }, points: ys.map((y, k) => ({ x: String(k + 1), y: String(y) })) } }
}
function comparison(entries: ReturnType<typeof entry>[]): CompareResponseDto {
  return { kind: 'spot-rate', compounding: 'annual', knots: [], result: { baseline: entries[0]!.label, entries, pairs: [], money: [] } } as unknown as CompareResponseDto
}

describe('one style per method in every chart', () => {
  const all = comparison([entry('Linear', 'linear', [0.01, 0.02, 0.03]), entry('Akima', 'akima', [0.01, 0.021, 0.03]), entry('PCHIP', 'pchip', [0.01, 0.022, 0.03]), entry('PCHIP on logs', 'pchip', [0.01, 0.019, 0.03])])
  const some = comparison([entry('Akima', 'akima', [0.01, 0.021, 0.03]), entry('PCHIP', 'pchip', [0.01, 0.022, 0.03])])
  it('values, differences and forwards give each label the same style, whatever subset is drawn', () => {
    for (const res of [all, some]) {
      const charts = [valueSeries(res), differenceSeries(res, res.result.baseline), forwardSeries(res)]
      for (const chart of charts) {
        for (const s of chart) {
          const method = res.result.entries.find(e => e.label === s.name)!
          const first = method.ok && res.result.entries.filter(e => e.ok && e.result.spec.method === method.result.spec.method).indexOf(method)
          expect(s.style, s.name).toEqual(methodStyle((method as { result: { spec: { method: 'akima' } } }).result.spec.method, first || 0))
        }
      }
    }
    expect(valueSeries(some).find(s => s.name === 'Akima')!.style).toEqual(valueSeries(all).find(s => s.name === 'Akima')!.style)
    const [plain, logs] = [valueSeries(all)[2]!.style!, valueSeries(all)[3]!.style!]
    expect(plain.colour).toBe(logs.colour)
    expect(plain.dashIndex).not.toBe(logs.dashIndex)
  })
})
