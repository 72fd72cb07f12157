import { linear } from './linear'
import type { MethodDefinition } from './method'

export const logLinear: MethodDefinition = {
  id: 'log-linear',
  label: 'Log-linear',
  minPoints: 2,
  source: 'Linear interpolation of ln y: constant force of mortality between ages, flat forward rates between discount-factor tenors (Hagan and West 2006, "raw interpolation").',
  summary: 'Requires y > 0; y stays positive; geometric between neighbouring points. Transform must be none (the method already works on ln y).',
  options: [],
  scale: 'log',
  // ln y_i -> straight lines -> exp (Hagan and West 2006, "raw interpolation")
  fit: (x, y, options, D) => linear.fit(x, y, options, D),
}
