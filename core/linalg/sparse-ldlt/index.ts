// Sparse LDLᵀ: ordering, symbolic analysis, numeric factorization. See README.md for the flow.
export { analyzeSparseLdlt } from './symbolic';
export type { SparseLdltSymbolic, SparseLdltAnalyzeOptions } from './symbolic';
export { factorizeSparseLdlt } from './numeric';
export type { SparseLdltFactorization, SparseLdltOptions } from './numeric';
export { orderNestedDissection } from './ordering';
export type { OrderingOptions } from './ordering';
export { createShiftedPencil, multiplyLower } from './shifted';
export type { ShiftedPencil } from './shifted';
