import type { Db, DbOrTx } from '../../db/index';
import type { Logger } from '../../http/logger';
import type { Mailer, MailMessage } from '../../mail/mailer';
import { activityService } from '../activity/activity.service';
import type { NewActivity } from '../activity/activity.repository';
import type { SheetEvaluator } from './evaluator';

/** What the review services need besides the request: database, mail and the evaluator. */
export interface ReviewDeps {
  db: Db;
  mailer: Mailer;
  evaluate: SheetEvaluator;
  log: Logger;
}

export type ReviewActivityAction =
  | 'revision.issued'
  | 'revision.returned'
  | 'revision.signed_off'
  | 'revision.sealed'
  | 'revision.superseded'
  | 'remark.added'
  | 'remark.carried'
  | 'remark.replied'
  | 'remark.closed'
  | 'remark.reopened'
  | 'seal.refused'
  | 'signing_key.created'
  | 'signing_key.reencrypted'
  | 'account.password_changed';

/**
 * Appends an activity row for a review action. The foundation's action union lists its own
 * actions; these are ours, so the type is widened here, in one place. Rows about a sheet carry
 * `sheetId` in their details, which is how a sheet's history finds them.
 */
export function recordReviewActivity(
  db: DbOrTx,
  entry: Omit<NewActivity, 'action'> & { action: ReviewActivityAction },
): Promise<number> {
  return activityService.record(db, entry as unknown as NewActivity);
}

/**
 * Sends after the transaction has committed. A mail failure never undoes the action (the
 * revision is issued whether or not the SMTP server answers); it is logged for the admin.
 */
export async function sendAfterCommit(deps: ReviewDeps, message: MailMessage): Promise<void> {
  try {
    await deps.mailer.send(message);
  } catch (e) {
    deps.log.error(`mail "${message.subject}" could not be sent`, e);
  }
}
