// The sheet engine: parse → evaluate block by block → results → canonical text/JSON → digests.
// See README.md beside this file.
export * from './types';
export { ENGINE_VERSION } from './version';
export { evaluateSheet, DEFAULT_SIGNIFICANT_FIGURES } from './evaluate';
export {
  canonicalText,
  canonicalHeader,
  blockLines,
  splitComment,
  locateCanonicalLine,
  canonicalLineOf,
  validateSheet,
} from './source';
export { canonicalJson, sha256Hex, digestSheet, type SheetDigests } from './canonical';
export { latexName } from './latex';
export { formatNumber } from './format';
export { FORBIDDEN_FUNCTIONS } from './math';
export {
  diffSheets,
  diffBlocks,
  diffResults,
  mapLine,
  type SheetDiff,
  type BlockChange,
  type LineHunk,
  type ResultChange,
  type CriterionFlip,
  type MappedLine,
} from './diff';
