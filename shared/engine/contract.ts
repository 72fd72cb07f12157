// The engine's contract: its vocabulary (as const lists) and its request and result types. Import-free on purpose:
// the engine (server/engine), the shared code and the client all read these, and nothing here reads them back.
// All table values are decimal strings.

/** Interpolation methods, in the order the product lists them. */
export const METHOD_IDS = ['linear', 'log-linear', 'quadratic', 'cubic-natural', 'cubic-clamped', 'cubic-not-a-knot', 'pchip', 'akima', 'monotone-convex', 'smith-wilson'] as const
export type MethodId = (typeof METHOD_IDS)[number]

/** Scales a method may work on (the values are mapped there, filled, and mapped back). */
export const TRANSFORM_IDS = ['none', 'log', 'logit', 'cumulative-hazard', 'log-discount'] as const
export type TransformId = (typeof TRANSFORM_IDS)[number]

/** What happens to points outside the given range ('method': the method extends itself, where it has its own extension). */
export const EXTRAPOLATION_RULES = ['error', 'flat', 'linear', 'method'] as const
export type ExtrapolationRule = (typeof EXTRAPOLATION_RULES)[number]

/** Table kinds: they decide the range checks, the forward-rate check and the money view. */
export const TABLE_KINDS = ['mortality', 'lapse', 'salary', 'spot-rate', 'discount-factor', 'other'] as const
export type TableKind = (typeof TABLE_KINDS)[number]

/** How a curve table's spot rates compound: ln P(t) = -t ln(1 + r), -r t, or -2t ln(1 + r/2). */
export const COMPOUNDING_IDS = ['annual', 'continuous', 'semi-annual'] as const
export type Compounding = (typeof COMPOUNDING_IDS)[number]

/** Table kinds whose values are a curve (spot rates or discount factors): compounding and forward rates apply. */
export const CURVE_KINDS = ['spot-rate', 'discount-factor'] as const satisfies readonly TableKind[]

export interface Knot { x: string, y: string }
export interface GridSpec { from: string, to: string, step: string }

/** Options for the money view. Ages and annuity terms are whole numbers; rates and terms are decimal strings. */
export interface MoneyOptions {
  /** Mortality: ages at which e_x and the annuity-due are shown (default [65]). */
  ages?: number[]
  /** Mortality: annual effective interest rate for the annuity-due (default '0.03'). */
  interest?: string
  /** Curves: terms N (years) of the level annual annuity paid at 1..N (default [10, 20]). */
  annuityTerms?: number[]
  /** Curves: terms at which discount factors and forward rates are shown (default 1, 2, 5, 10, 20, 30). */
  keyTerms?: string[]
}

export interface FillRequest {
  knots: Knot[]
  method: MethodId
  /** Per-method options (see METHODS); values are strings. */
  options?: Record<string, string>
  transform?: TransformId
  /** Either a regular grid ... */
  grid?: GridSpec
  /** ... or a list of points (output keeps this order). */
  at?: string[]
  extrapolation?: ExtrapolationRule
  /** Significant digits of the results (default 40), half-even rounding. */
  precision?: number
  kind?: TableKind
  /** Curve kinds only: how the spot rates compound (default annual); curve methods work on ln P(t) under it. */
  compounding?: Compounding
  money?: MoneyOptions
}

export interface ResolvedMoneyOptions {
  ages: number[]
  interest: string
  annuityTerms: number[]
  keyTerms: string[]
}

/** Everything needed to reproduce a fill digit for digit (together with the knots). */
export interface ResolvedSpec {
  engineVersion: string
  method: MethodId
  options: Record<string, string>
  transform: TransformId
  extrapolation: ExtrapolationRule
  grid: GridSpec | null
  at: string[] | null
  precision: number
  /** Digits carried internally before the final rounding. */
  workingPrecision: number
  rounding: 'half-even'
  kind: TableKind
  /** Present for curve kinds (spot-rate, discount-factor): the compounding the rates were read and reported in. */
  compounding?: Compounding
  money: ResolvedMoneyOptions
  knotCount: number
}

export interface Located { x: string, value: string }
export interface Span { from: string, to: string }

export interface CurvatureReport {
  /** Where the sign of the second derivative was read: the fitted pieces on the method's own scale. */
  basis: string
  count: number
  /** Each change: a knot (from = to) where the second derivative jumps across zero, or a span between knots. */
  at: Span[]
}

export interface MonotonicityReport {
  knotDirection: 'increasing' | 'decreasing' | 'constant' | 'mixed'
  /** Turning points of the knots themselves. */
  knotTurningPoints: number
  /** Turning points of the filled values (where the first difference changes sign). */
  fillTurningPoints: number
  at: string[]
}

export interface RangeReport {
  rule: string
  count: number
  first: Located[]
}

export interface ForwardReport {
  convention: string
  minimum: { value: string, from: string, to: string } | null
  negativeCount: number
  negatives: Span[]
  largestJump: { value: string, at: string } | null
}

export interface Diagnostics {
  /** Largest |filled - given| over the knots, both rounded to the stated precision. Zero means exact reproduction. */
  maxKnotDeviation: string
  maxKnotDeviationAt: string | null
  knotsReproduced: boolean
  curvatureSignChanges: CurvatureReport
  roughness: { secondDifferences: string, thirdDifferences: string, basis: string }
  monotonicity: MonotonicityReport
  outOfRange: RangeReport
  forwards: ForwardReport | null
  /** Locality of a bump of the middle given point (null with fewer than 3 points, or when the bumped value is outside the transform's domain). */
  bump: BumpReport | null
  /** Methods that converge to an ultimate forward rate (smith-wilson): how close the forward comes at the convergence point. */
  convergence?: ConvergenceReport
  notes: string[]
}

/** Smith-Wilson's convergence check: the forward intensity at the convergence point against ln(1 + UFR). */
export interface ConvergenceReport {
  convergencePoint: string
  alpha: string
  /** ln(1 + UFR), the ultimate forward intensity. */
  ultimateIntensity: string
  /** The forward intensity -d ln P/dt at the convergence point. */
  forwardIntensity: string
  /** |forwardIntensity - ultimateIntensity| */
  gap: string
  /** The largest gap allowed: 0.0001 (1 basis point). */
  tolerance: string
  met: boolean
  /** The same check one step of the alpha search grid lower (null below the lower bound 0.05): not met when alpha was calibrated. */
  below: { alpha: string, gap: string, met: boolean } | null
}

export interface BumpReport {
  basis: string
  /** The given point that was moved, and by how much (on the table's per-unit scale). */
  at: string
  size: string
  /** Intervals between given points. */
  intervals: number
  /** Where anything changed at the stated precision: first and last given point of the changed intervals. */
  changed: { from: string, to: string, intervals: number } | null
  /** Where the change is at least 1 % of the bump. */
  material: { from: string, to: string, intervals: number } | null
  largest: string
  largestAt: string
  /** largest / size, 6 significant digits. */
  ratio: string
}

export interface MoneyFigure {
  key: string
  label: string
  value: string | null
  reason?: string
}

export interface MoneyImpact {
  basis: 'mortality' | 'curve' | 'none'
  available: boolean
  reason?: string
  figures: MoneyFigure[]
}

export interface FillResult {
  points: Knot[]
  diagnostics: Diagnostics
  money: MoneyImpact
  spec: ResolvedSpec
}

export interface MethodSpec {
  method: MethodId
  options?: Record<string, string>
  transform?: TransformId
  /** Name shown in the comparison; defaults to the method id plus non-default choices. */
  label?: string
}

export interface PairDifference {
  a: string
  b: string
  maxAbsDifference: string
  at: string | null
}

export interface MoneyDifference {
  label: string
  key: string
  baseline: string | null
  value: string | null
  absolute: string | null
  percent: string | null
}

export type CompareEntry =
  | { label: string, ok: true, result: FillResult }
  | { label: string, ok: false, error: string, code: string }

export interface CompareResult {
  baseline: string
  entries: CompareEntry[]
  pairs: PairDifference[]
  money: MoneyDifference[]
}

/** A method option as a client may show it: data only. */
export interface OptionDescriptor {
  name: string
  type: 'enum' | 'decimal'
  values?: string[]
  /** Decimal options only: words accepted instead of a number (e.g. 'auto'), resolved by the method to a number. */
  keywords?: string[]
  default: string
  description: string
  /** The option is used only when another option has one of these values, e.g. { condition: ['left-slope'] }. */
  appliesWhen?: Record<string, string[]>
}

/** Where a method applies, so a client offers it only there. */
export interface MethodApplicability {
  /** Table kinds the method fills. */
  kinds: TableKind[]
  /** Spacing of the given x the method accepts: 'any', or 'equal' steps only. */
  spacing: 'any' | 'equal'
}

/** What a client may show about a method: no functions, only data. */
export interface MethodListing {
  id: MethodId
  label: string
  /** Fewest knots accepted (as SciPy for the same method). */
  minPoints: number
  /** Published source of the method. */
  source: string
  summary: string
  options: OptionDescriptor[]
  appliesTo: MethodApplicability
  /** Extrapolation rules the method accepts ('method' only where it has its own extension). */
  extrapolation: ExtrapolationRule[]
}

/** What a client may show about a transform. */
export interface TransformListing {
  id: TransformId
  label: string
  domain: string
  description: string
}

/** A given value of a two-way table: x (e.g. age at entry) and d (e.g. duration) on the two axes. */
export interface Knot2D { x: string, d: string, y: string }

/** A method for one axis of a two-way fill. */
export interface AxisMethod { method: MethodId, options?: Record<string, string> }

/** One axis's output points: a regular grid or a list. */
export type AxisPoints = GridSpec | string[]

export interface Fill2DRequest {
  /** Values on a full rectangular grid: every x with every d, once. */
  knots: Knot2D[]
  /** One method for both axes (its options in `options`), or one per axis. */
  method: MethodId | { x: AxisMethod, d: AxisMethod }
  options?: Record<string, string>
  /** A scale applied to y before both passes and undone after them (none, log, logit, cumulative-hazard). */
  transform?: TransformId
  /** Either a grid on each axis (every x with every d) ... */
  grid?: { x: AxisPoints, d: AxisPoints }
  /** ... or a list of points (output keeps this order). */
  at?: { x: string, d: string }[]
  /** Applies along both axes ('method' is not offered: no method that fills both axes has an extension of its own). */
  extrapolation?: ExtrapolationRule
  precision?: number
  kind?: TableKind
}

export interface Resolved2DSpec {
  engineVersion: string
  /** The methods and resolved options, per axis; the fill runs along x first (every given d), then along d. */
  methods: { x: { method: MethodId, options: Record<string, string> }, d: { method: MethodId, options: Record<string, string> } }
  transform: TransformId
  extrapolation: ExtrapolationRule
  grid: { x: GridSpec | string[], d: GridSpec | string[] } | null
  at: { x: string, d: string }[] | null
  precision: number
  workingPrecision: number
  rounding: 'half-even'
  kind: TableKind
  /** Given values along each axis. */
  knotCount: { x: number, d: number }
}

export interface Fill2DResult {
  points: Knot2D[]
  spec: Resolved2DSpec
  diagnostics: {
    /** Largest |filled - given| over the given points, both rounded to the stated precision. */
    maxKnotDeviation: string
    knotsReproduced: boolean
    notes: string[]
  }
}
