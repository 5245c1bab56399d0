// The words the server stores and the client shows, written once. This module imports nothing,
// so the client may import it (values and types) without pulling server or engine code.

/** The roles a person holds within one project. Admin is installation-wide, not a role here. */
export const PROJECT_ROLES = ['author', 'checker', 'principal', 'viewer'] as const;
export type ProjectRole = (typeof PROJECT_ROLES)[number];

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
  'remark.closed',
  'remark.reopened',
  'seal.refused',
  'signing_key.created',
] as const;
export type ActivityAction = (typeof ACTIVITY_ACTIONS)[number];
