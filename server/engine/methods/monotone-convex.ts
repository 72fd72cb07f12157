import { CURVE_KINDS } from '../types'
import { monotoneConvexPieces } from '../monotone-convex'
import type { MethodDefinition } from './method'

export const monotoneConvex: MethodDefinition = {
  id: 'monotone-convex',
  label: 'Monotone convex (curves)',
  minPoints: 2,
  source: 'Hagan and West (2006), "Interpolation methods for curve construction", Applied Mathematical Finance 13(2) 89-129, section 4; Hagan and West (2008), "Methods for constructing a yield curve", Wilmott Magazine.',
  summary: 'For spot rates and discount factors. Works on ln P(t): keeps every discrete forward between given terms, continuous instantaneous forwards, local (a point moves at most the two intervals on each side), and with the positivity step positive forwards wherever the discrete forwards are positive.',
  options: [
    {
      name: 'positivity',
      label: 'Keep forwards positive',
      type: 'enum',
      values: ['on', 'off'],
      valueLabels: { on: 'Yes (bound each forward)', off: 'No (unbounded estimates)' },
      default: 'on',
      description: 'Bound the forward at each given term to [0, twice the smaller neighbouring discrete forward] (Hagan and West\'s positivity step); off keeps the unbounded estimates.',
    },
  ],
  scale: 'log-discount',
  appliesTo: { kinds: [...CURVE_KINDS], spacing: 'any' },
  fit(x, y, options) {
    // x starts at t = 0 with ln P = 0 (the pipeline anchors curve methods there)
    return monotoneConvexPieces(x, y, options.positivity !== 'off')
  },
}
