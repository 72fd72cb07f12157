// The engine's contract: its vocabulary (as const lists) and its request and result types. Import-free on purpose:
// the engine (server/engine), the shared code and the client all read these, and nothing here reads them back.
// All table values are decimal strings.

/** Caution to show beside every result and beside Sign off (OWNER_RULES: safety). */
export const REVIEW_CAUTION = 'Filled values are a calculation aid. Before use in reserves or prices, they need review by a qualified actuary under the applicable actuarial standards and local regulation.'

/** Interpolation methods, in the order the product lists them. */
export const METHOD_IDS = ['linear', 'log-linear', 'quadratic', 'cubic-natural', 'cubic-clamped', 'cubic-not-a-knot', 'pchip', 'akima', 'karup-king', 'sprague', 'beers', 'monotone-convex', 'smith-wilson'] as const
export type MethodId = (typeof METHOD_IDS)[number]

/** Scales a method may work on (the values are mapped there, filled, and mapped back). */
export const TRANSFORM_IDS = ['none', 'log', 'logit', 'cumulative-hazard', 'log-discount'] as const
export type TransformId = (typeof TRANSFORM_IDS)[number]

/**
 * What happens to points outside the given range. gompertz and kannisto close a mortality table at old ages: above the last
 * given age q follows a law fitted to the oldest given ages, up to a terminal age where q = 1 (options: extrapolationOptions).
 * method: the method extends itself, where it has an extension of its own (the method listing's `extrapolation`).
 */
export const EXTRAPOLATION_RULES = ['error', 'flat', 'linear', 'gompertz', 'kannisto', 'method'] as const
export type ExtrapolationRule = (typeof EXTRAPOLATION_RULES)[number]

/** Table kinds: they decide the range checks, the forward-rate check and the money view. */
export const TABLE_KINDS = ['mortality', 'lapse', 'salary', 'spot-rate', 'discount-factor', 'other'] as const
export type TableKind = (typeof TABLE_KINDS)[number]

/** How a curve table's spot rates compound: ln P(t) = -t ln(1 + r), -r t, or -2t ln(1 + r/2). */
export const COMPOUNDING_IDS = ['annual', 'continuous', 'semi-annual'] as const
export type Compounding = (typeof COMPOUNDING_IDS)[number]

/** Table kinds whose values are a curve (spot rates or discount factors): compounding and forward rates apply. */
export const CURVE_KINDS = ['spot-rate', 'discount-factor'] as const satisfies readonly TableKind[]

/** The closure rules among EXTRAPOLATION_RULES: a fitted mortality law above the last given age. */
export const CLOSURE_RULES = ['gompertz', 'kannisto'] as const
export type ClosureRule = (typeof CLOSURE_RULES)[number]

/** Table kinds each extrapolation rule applies to: a client offers a rule only there, and the engine refuses it elsewhere. */
export const EXTRAPOLATION_KINDS: Record<ExtrapolationRule, readonly TableKind[]> = {
  error: TABLE_KINDS,
  flat: TABLE_KINDS,
  linear: TABLE_KINDS,
  gompertz: ['mortality'],
  kannisto: ['mortality'],
  // wherever the chosen method has an extension of its own (smith-wilson: curve kinds); the method refuses it otherwise
  method: TABLE_KINDS,
}

/**
 * Significant digits of results: the default, the fewest and the most a request may ask for. The error budget that
 * relates them to the digits the engine carries internally is documented in server/engine/precision.ts.
 */
export const DEFAULT_PRECISION = 40
export const MIN_PRECISION = 6
export const MAX_PRECISION = 200
/** Most significant digits of a table value as typed or imported. */
export const MAX_INPUT_DIGITS = 40
/**
 * Digits of the shared decimal-text context (shared/decimal-text.ts): 2 x MAX_PRECISION. Scaling by a power of ten never
 * adds digits, so it is exact for any value the engine emits; a sum or difference of two such values is exact when
 * their leading digits are at most MAX_PRECISION places apart (the exact result then has at most 2 x MAX_PRECISION + 1
 * digits; in the last case one rounding at 400 digits, far below any digit shown).
 */
export const TEXT_DIGITS = 2 * MAX_PRECISION
/** Decimal places of the points of a fraction step (1/12: monthly terms in years) unless the grid says otherwise. */
export const FRACTION_STEP_PLACES = 12

export interface Knot { x: string, y: string }
/**
 * A regular grid from `from` to `to` (inclusive when reached). `step` is a decimal ('0.5'), or a fraction of two whole
 * numbers ('1/12'): point k is then from + k a/b rounded half-even to `places` decimals (default FRACTION_STEP_PLACES),
 * so whole and half years stay exact. The resolved spec records `places` for a fraction step.
 */
export interface GridSpec { from: string, to: string, step: string, places?: number }

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
  /**
   * Options of the extrapolation rule, decimal strings. gompertz / kannisto: terminalAge (default '120': q = 1 there and
   * above), fitFrom and fitTo (the given ages the law is fitted to; default the last 15 years of given ages).
   */
  extrapolationOptions?: Record<string, string>
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
  /** The extrapolation rule's options with defaults filled in (null for rules without options). */
  extrapolationOptions: Record<string, string> | null
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
  /** Old-age closure (extrapolation gompertz or kannisto): the fitted law and how well it fits; null otherwise. */
  closure: ClosureReport | null
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

export interface ClosureReport {
  law: 'gompertz' | 'kannisto'
  /** gompertz: mu_x = B c^x; kannisto: mu_x = a e^(b (x - x0)) / (1 + a e^(b (x - x0))). 12 significant digits. */
  parameters: Record<string, string>
  fitFrom: string
  fitTo: string
  /** Given ages inside the fitting range. */
  fitAges: number
  /** Largest |ln h_law - ln h_given| over the fitting ages (0 when the data follow the law). */
  maxLogHazardResidual: string
  /** q from the law at the last given age minus the given q there: the step where the closure takes over. */
  lawMinusGivenAtLastAge: string
  terminalAge: string
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
  /** mortality and curve: money figures; persistency (lapse) and salary: money-free summaries */
  basis: 'mortality' | 'curve' | 'persistency' | 'salary' | 'none'
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
  /** The option's id in requests and stored specs (never shown to a person). */
  name: string
  /** What a person reads: "Start slope", "Extra condition". */
  label: string
  /** Words for each enum value ("Straight first piece"); ids stay in requests and stored specs. */
  valueLabels?: Record<string, string>
  type: 'enum' | 'decimal'
  values?: string[]
  /** Decimal options only: words accepted instead of a number (e.g. 'auto'), resolved by the method to a number. */
  keywords?: string[]
  default: string
  description: string
  /** The option is used only when another option has one of these values, e.g. { condition: ['left-slope'] }. */
  appliesWhen?: Record<string, string[]>
}

/**
 * Where a method applies, so a client offers it only there: the table kinds it is meant for, and whether it needs equally
 * spaced points ('equal': the engine refuses other spacing with code unequal-spacing).
 */
export interface MethodScope {
  kinds: TableKind[]
  spacing: 'equal' | 'any'
}

/** What a client may show about a method: no functions, only data. */
export interface MethodListing {
  id: MethodId
  label: string
  /** Fewest knots accepted (as SciPy for the same method). */
  minPoints: number
  appliesTo: MethodScope
  /** Published source of the method. */
  source: string
  summary: string
  options: OptionDescriptor[]
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

/** Methods that split group totals into single-year values (the pivotal formulas applied to cumulative totals). */
export const SPLIT_METHOD_IDS = ['sprague', 'beers', 'karup-king'] as const
export type SplitMethodId = (typeof SPLIT_METHOD_IDS)[number]

/** A group (band) of single years from `from` to `to` inclusive (whole numbers: 55-59 is { from: '55', to: '59' }) and its total. */
export interface GroupTotal { from: string, to: string, total: string }

export interface SplitRequest {
  /** Contiguous groups of equal width (in any order); at least 2 (karup-king), 4 (sprague) or 5 (beers). */
  groups: GroupTotal[]
  method: SplitMethodId
  /** Significant digits of each group's total (default 40); the single-year values are given to the decimal places of that last digit. */
  precision?: number
}

export interface SplitSpec {
  engineVersion: string
  method: SplitMethodId
  precision: number
  workingPrecision: number
  rounding: 'half-even, residue by largest remainder'
  /** Width of every group (single years). */
  width: number
  groups: GroupTotal[]
}

export interface SplitDiagnostics {
  /** Every group's single-year values add up to its total rounded to the stated precision, exactly. */
  totalsKept: boolean
  /** Values moved by one unit of their last place so that their group adds up (largest-remainder rule): count and the first 20. */
  adjusted: { count: number, at: string[] }
  /** Single-year values below zero (a total of deaths or exposures cannot be split into negative parts): count and the first 20. */
  negatives: { count: number, first: Located[] }
  notes: string[]
}

export interface SplitResult {
  points: Knot[]
  spec: SplitSpec
  diagnostics: SplitDiagnostics
}

/**
 * One age (or other equally spaced x) of a graduation. y is the crude rate; with deaths and exposure given, y may be left out
 * (it is then deaths / exposure) and the fit tests compare actual with expected deaths. weight defaults to the exposure,
 * else 1.
 */
export interface GraduationPoint { x: string, y?: string, weight?: string, deaths?: string, exposure?: string }

export interface GraduateRequest {
  points: GraduationPoint[]
  /** z, the order of the differences that are penalised (1 to 6; default 3, Whittaker's choice). */
  order?: number
  /** h >= 0, the weight of smoothness against fit (a decimal string). */
  smoothing: string
  precision?: number
  /**
   * How deaths relate to the exposure: 'central' (exposure in years lived, deaths Poisson with mean E u; default) or
   * 'initial' (lives at the start of the year, deaths binomial with mean E u and variance E u (1 - u)).
   */
  exposureType?: 'central' | 'initial'
}

export interface GraduationSpec {
  engineVersion: string
  method: 'whittaker-henderson'
  order: number
  smoothing: string
  precision: number
  workingPrecision: number
  rounding: 'half-even'
  exposureType: 'central' | 'initial'
  /** Where the weights came from. */
  weights: 'given' | 'exposure' | 'one' | 'mixed'
  pointCount: number
  /** Steps of iterative refinement the banded solve needed to reach the stated precision. */
  refinements: number
}

export interface GraduationDiagnostics {
  /** sum w (u - y)^2 at the graduated values. */
  fit: string
  /** Sums of squared differences of order `order` of the graduated and of the crude values, and of third differences of the graduated ones. */
  smoothness: { order: number, graduated: string, crude: string, thirdDifferences: string }
  /** Trace of the hat matrix (W + h K'K)^-1 W: how many parameters the graduation spends (order z when h is very large, n when h = 0). */
  effectiveParameters: string
  /** Per point: standardised deviation (actual - expected deaths) / sqrt(variance) with deaths and exposures, else sqrt(w) (y - u). */
  deviations: { basis: string, standardised: boolean, values: Located[] }
  /** Sum of squared standardised deviations against chi-square with n - effectiveParameters degrees of freedom (null without deaths and exposures). */
  chiSquare: { statistic: string, degreesOfFreedom: string, pValue: string } | null
  /** Standardised deviations by band against the normal distribution's expectation (null without deaths and exposures). */
  distribution: { bands: string[], observed: number[], expected: string[] } | null
  /** Signs of the deviations: positives against negatives, two-sided binomial p-value (zero deviations left out). */
  signs: { positive: number, negative: number, pValue: string }
  /** Runs of equal sign; positive groups and P(this few or fewer) given the counts (the grouping of signs test). */
  runs: { runs: number, positiveGroups: number, pValue: string }
  notes: string[]
}

export interface GraduateResult {
  points: Knot[]
  spec: GraduationSpec
  diagnostics: GraduationDiagnostics
}
