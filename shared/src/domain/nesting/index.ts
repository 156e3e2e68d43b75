/**
 * Kitwright's nesting engine: one-dimensional cutting stock with kerf, end trim, several stick
 * lengths and existing offcuts. Pure code, no I/O; call it off the main thread on a server.
 * @module
 */
export { nest } from './nest'
export { continuousBound, martelloTothL2 } from './bounds'
export { firstFitDecreasing } from './ffd'
export { NestingInputError } from './types'
export type {
  NestBounds,
  NestBoundSource,
  NestCut,
  NestInput,
  NestOffcut,
  NestOptions,
  NestPattern,
  NestPiece,
  NestPlan,
  NestStick,
  NestStickSource,
  NestStockOption,
  NestStats,
  NestStockUse,
  NestTotals,
} from './types'
