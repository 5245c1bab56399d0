export { BlockResultView, type BlockResult, type SheetResults } from './block-results';
export { Tex } from './tex';
