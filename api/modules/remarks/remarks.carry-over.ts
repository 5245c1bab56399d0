import { mapLine, type Sheet, type SheetBlock } from '../../../core/index';
import type { DbOrTx } from '../../db/index';
import { activityService } from '../activity/activity.service';
import type { RevisionRecord } from '../revisions/revisions.repository';
import { remarksRepository } from './remarks.repository';

/**
 * Copies the open and answered remarks of the previous revision to the new one. A remark whose
 * line is unchanged moves to where that line now is; one whose line was edited moves to the edited
 * line and is flagged line_changed; one whose line (or block) is gone stays at its old place,
 * flagged, for the checker to look at. The old remarks are left as they were: they are the record
 * of what was said about the old revision.
 */
export async function carryRemarks(
  trx: DbOrTx,
  input: {
    from: RevisionRecord;
    toRevisionId: number;
    toSheet: Sheet;
    at: Date;
    projectId?: number;
  },
): Promise<{ carried: number; lineChanged: number }> {
  const remarks = (await remarksRepository.listByRevision(trx, input.from.id)).filter(
    (r) => r.state !== 'closed',
  );
  if (remarks.length === 0) return { carried: 0, lineChanged: 0 };
  const oldSheet: Sheet = {
    blocks: input.from.blocks as SheetBlock[],
    settings: input.from.settings,
  };
  let lineChanged = 0;
  for (const r of remarks) {
    const mapped = mapLine(oldSheet, input.toSheet, { blockId: r.blockId, line: r.line });
    const flagged = mapped.status !== 'same';
    if (flagged) lineChanged++;
    await remarksRepository.insert(trx, {
      revisionId: input.toRevisionId,
      blockId: mapped.status === 'gone' ? r.blockId : mapped.blockId,
      line: mapped.status === 'gone' ? r.line : mapped.line,
      type: r.type,
      text: r.text,
      state: r.state,
      authorId: r.author.id,
      carriedFrom: { remarkId: r.id, revisionNumber: input.from.number, line: r.line },
      lineChanged: flagged,
      createdAt: input.at,
    });
  }
  if (input.projectId !== undefined) {
    await activityService.record(trx, {
      actorId: null,
      projectId: input.projectId,
      action: 'remark.carried',
      objectType: 'revision',
      objectId: input.toRevisionId,
      details: {
        sheetId: input.from.sheetId,
        fromRevision: input.from.number,
        carried: remarks.length,
        lineChanged,
      },
    });
  }
  return { carried: remarks.length, lineChanged };
}
