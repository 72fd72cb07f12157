/**
 * Knotwork numerical engine: fills sparse basis tables by interpolation in decimal arithmetic.
 * Pure TypeScript: imports decimal.js and nothing from the framework or the database.
 */
export { fill } from './fill'
export { fill2d } from './fill2d'
export { compare, compareAsync } from './compare'
export { split } from './split'
export { graduate } from './graduate'
export { EngineError, type EngineErrorCode } from './errors'
export { METHODS, type MethodListing } from './registry'
export type { OptionDescriptor } from './methods/method'
export { TRANSFORM_LISTING, type TransformListing } from './transform-listing'
export { ENGINE_VERSION } from './version'
export { DEFAULT_PRECISION, MIN_PRECISION, MAX_PRECISION, GUARD_DIGITS } from './precision'
export type * from './types'
export { REVIEW_CAUTION } from './types'
