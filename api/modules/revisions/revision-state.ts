import type { ProjectRole, RevisionStatus } from '../../../core/vocabulary';
import { AppError } from '../../http/errors';
import type { SheetContext } from '../sheets/sheets.repository';
import type { RevisionRecord } from './revisions.repository';

/** A revision, its sheet and the caller's roles, once the access policy has let the caller in. */
export interface RevisionInScope {
  rev: RevisionRecord;
  sheet: SheetContext;
  myRoles: ProjectRole[];
}

const statusWords: Record<RevisionStatus, string> = {
  in_check: 'in check',
  returned: 'returned to the author',
  checked: 'signed off and awaiting its seal',
  sealed: 'sealed',
  superseded: 'superseded by a later sealed revision',
};

/** The 409 for an action a revision's status does not allow: "Rev 2 is sealed; <needed>." */
export function wrongState(
  rev: { number: number; status: string },
  needed: string,
  code: string,
): AppError {
  const words = statusWords[rev.status as RevisionStatus] ?? rev.status;
  return new AppError(409, code, `Rev ${rev.number} is ${words}; ${needed}.`, {
    details: { status: rev.status },
  });
}

/** The 403 for a checker's action on a revision the same person issued. */
export function checkerIsAuthor(rev: { number: number }, doing: string): AppError {
  return new AppError(
    403,
    'CHECKER_IS_AUTHOR',
    `You issued Rev ${rev.number}, so you cannot ${doing} it: a revision is checked by someone who did not write it.`,
  );
}
