// The words the server stores and the client shows, written once. This module imports nothing,
// so the client may import it (values and types) without pulling server or engine code.

/**
 * Block ids the editor makes (`b` and 12 hex digits) mean nothing to a reader; ids an author or a
 * template gave (`deck-data`) do, and are worth showing.
 */
export function isGeneratedBlockId(id: string): boolean {
  return /^b[0-9a-f]{12}$/.test(id);
}

/** The kinds of block (DESIGN.md §4); `response` runs an analysis on a modes result above it. */
export const BLOCK_KINDS = ['text', 'calc', 'matrix', 'modes', 'response', 'criteria'] as const;
export type BlockKind = (typeof BLOCK_KINDS)[number];

/** The roles a person holds within one project. Admin is installation-wide, not a role here. */
export const PROJECT_ROLES = ['author', 'checker', 'principal', 'viewer'] as const;
export type ProjectRole = (typeof PROJECT_ROLES)[number];
/** The roles that may have a sheet evaluated: those who edit or check it (not a viewer). */
export const EVALUATING_ROLES = [
  'author',
  'checker',
  'principal',
] as const satisfies readonly ProjectRole[];

/** Where a sheet stands in review (the sheets.status column). */
export const SHEET_STATUSES = ['draft', 'in_check', 'returned', 'checked', 'sealed'] as const;
export type SheetStatus = (typeof SHEET_STATUSES)[number];

/** Where a revision stands (the revisions.status column). */
export const REVISION_STATUSES = [
  'in_check',
  'returned',
  'checked',
  'sealed',
  'superseded',
] as const;
export type RevisionStatus = (typeof REVISION_STATUSES)[number];

/** A checker's remark: its kind and where its thread stands. */
export const REMARK_TYPES = ['error', 'query', 'editorial'] as const;
export type RemarkType = (typeof REMARK_TYPES)[number];
export const REMARK_STATES = ['open', 'answered', 'closed'] as const;
export type RemarkState = (typeof REMARK_STATES)[number];

/** Every action the activity table records (its `action` column). */
export const ACTIVITY_ACTIONS = [
  'project.created',
  'project.updated',
  'member.added',
  'member.roles_changed',
  'member.removed',
  'user.created',
  'user.updated',
  'user.deactivated',
  'user.reactivated',
  'user.password_reset_sent',
  'auth.signed_in',
  'auth.signed_out',
  'account.password_changed',
  'account.password_reset',
  'sheet.created',
  'sheet.renamed',
  'sheet.draft_saved',
  'sheet.deleted',
  'upload.added',
  'revision.issued',
  'revision.returned',
  'revision.signed_off',
  'revision.sealed',
  'revision.superseded',
  'remark.added',
  'remark.carried',
  'remark.replied',
  'remark.reply_edited',
  'remark.reply_withdrawn',
  'remark.closed',
  'remark.reopened',
  'seal.refused',
  'signing_key.created',
  'signing_key.retired',
  'template.saved',
  'template.updated',
  'template.deleted',
] as const;
export type ActivityAction = (typeof ACTIVITY_ACTIONS)[number];

/**
 * The actions a project's viewer (the client's representative) reads in its activity: what was
 * issued, checked and sealed. Drafts, remarks, uploads and refusals are the firm's working record.
 */
export const CLIENT_FACING_ACTIONS: readonly ActivityAction[] = [
  'project.created',
  'sheet.created',
  'revision.issued',
  'revision.signed_off',
  'revision.sealed',
  'revision.superseded',
];

/** The analyses a response block runs (core/sheet/blocks/response.ts). */
export const RESPONSE_ANALYSES = ['spectrum', 'harmonic', 'history', 'walking'] as const;

/** The keys every response block reads, whatever its analysis. */
export const RESPONSE_COMMON_KEYS = ['modes', 'analysis', 'damping', 'name'] as const;

/** The keys of each response analysis besides the common ones, in the order the reference lists them. */
export const RESPONSE_ANALYSIS_KEYS = {
  spectrum: [
    'spectrum',
    'sds',
    'sd1',
    'tl',
    'r',
    'ie',
    'ground',
    'ag',
    'q',
    'table',
    'table unit',
    'combine',
    'direction',
    'directional',
    'heights',
    'elf base shear',
    'elf share',
  ],
  harmonic: ['force', 'unbalance', 'at', 'running speed', 'range', 'points', 'rayleigh', 'dofs'],
  history: ['record', 'record unit', 'force', 'direction', 'step', 'duration', 'method', 'dofs'],
  walking: ['mode', 'at', 'force', 'limit'],
} as const satisfies Record<(typeof RESPONSE_ANALYSES)[number], readonly string[]>;

export type ResponseKey =
  | (typeof RESPONSE_COMMON_KEYS)[number]
  | (typeof RESPONSE_ANALYSIS_KEYS)[keyof typeof RESPONSE_ANALYSIS_KEYS][number];

/** Every key a response block knows (lower case), each once: the engine's and the editor's list. */
export const RESPONSE_KEYS: readonly ResponseKey[] = [
  ...new Set<ResponseKey>([
    ...RESPONSE_COMMON_KEYS,
    ...Object.values(RESPONSE_ANALYSIS_KEYS).flat(),
  ]),
];
