import { CLIENT_FACING_ACTIONS } from '../../../core/vocabulary';
import type { Db, DbOrTx } from '../../db/index';
import { activityRepository, type ActivityEntry, type NewActivity } from './activity.repository';

const clientFacing = new Set<string>(CLIENT_FACING_ACTIONS);

export const activityService = {
  /** The entries a project's viewer reads (core/vocabulary.ts CLIENT_FACING_ACTIONS). */
  clientFacing(entries: ActivityEntry[]): ActivityEntry[] {
    return entries.filter((e) => clientFacing.has(e.action));
  },

  /** Appends one row; called by other services inside their own transaction. */
  record(db: DbOrTx, entry: NewActivity): Promise<number> {
    return activityRepository.insert(db, entry);
  },

  /** Newest first. Authorization (member or admin) is checked by the route. */
  listForProject(db: Db, projectId: number, limit = 200): Promise<ActivityEntry[]> {
    return activityRepository.listByProject(db, projectId, limit);
  },

  /** A sheet's history, newest first (the caller has checked that the person may read it). */
  listForSheet(db: Db, projectId: number, sheetId: number, limit = 300): Promise<ActivityEntry[]> {
    return activityRepository.listBySheet(db, projectId, sheetId, limit);
  },
};
