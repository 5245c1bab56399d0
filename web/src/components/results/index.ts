export { BlockResultView, type BlockResult, type SheetResults } from './block-results';
export { Tex } from './tex';
export { handParts } from './hand-parts';
export { ModesWarnings, splitModesWarnings, powerOfTen } from './modes-warnings';
export { ParticipationNote } from './participation-note';
export { ModesDownloads } from './modes-downloads';
export { ResponseResults } from './response-results';
export { ModeShapesTable } from './mode-shapes-table';
export { shapeRows } from './shape-rows';
