// The sheet engine's result types (core/sheet/types.ts), imported as types only: the engine's
// runtime (mathjs) stays on the server.
export type {
  BlockResult,
  CalcBlockResult,
  CriteriaBlockResult,
  MatrixBlockResult,
  ModesBlockResult,
  SheetIssue,
  SheetProgress,
  SheetResults,
  SheetValue,
} from '../../../../../core/index';
