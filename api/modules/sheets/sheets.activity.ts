import type { DbOrTx } from '../../db/index';
import { activityService } from '../activity/activity.service';
import type { NewActivity } from '../activity/activity.repository';

export type SheetActivityAction =
  'sheet.created' | 'sheet.renamed' | 'sheet.draft_saved' | 'sheet.deleted' | 'upload.added';

/** Autosaves are coalesced: at most one `sheet.draft_saved` per sheet and person per window. */
export const DRAFT_SAVED_COALESCE_MINUTES = 10;

/**
 * Appends an activity row for a sheet or upload action. The foundation's action union lists its
 * own actions only; these are ours, so the type is widened here, in one place.
 */
export function recordSheetActivity(
  db: DbOrTx,
  entry: Omit<NewActivity, 'action'> & { action: SheetActivityAction },
): Promise<number> {
  return activityService.record(db, entry as unknown as NewActivity);
}
