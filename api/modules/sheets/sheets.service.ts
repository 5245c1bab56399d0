import type { Knex } from 'knex';
import type { DraftConflictDetails, DraftSaved } from '../../../core/contract/sheets';
import type { ProjectRole, SheetStatus } from '../../../core/vocabulary';
import type { DbOrTx } from '../../db/index';
import { isDuplicateKeyError } from '../../db/index';
import { permits } from '../../http/access';
import type { AppContext } from '../../http/context';
import { AppError, ConflictError, NotFoundError } from '../../http/errors';
import { activityService } from '../activity/activity.service';
import type { User } from '../users/users.repository';
import { evaluateStored, evaluateWithUploads } from './sheets.evaluate';
import {
  countRevisions,
  deleteSheet,
  findSheetById,
  findSheetContext,
  findSheetProjectId,
  hasRecentDraftSavedActivity,
  insertSheet,
  listSheetsByProject,
  lockSheet,
  saveDraftIfVersion,
  setSheetStatus,
  updateSheetFields,
  type SheetContext,
  type SheetDraft,
  type SheetRecord,
  type SheetSummary,
} from './sheets.repository';
import type { CreateSheetBody, DraftBody, UpdateSheetBody } from './sheets.schemas';
import { draftFromTemplate, listTemplates, type SheetTemplateInfo } from './sheets.templates';

/** Autosaves are coalesced: at most one `sheet.draft_saved` per sheet and person per window. */
export const DRAFT_SAVED_COALESCE_MINUTES = 10;

/** A sheet as the API sends it: the stored record and the caller's roles in its project. */
export interface SheetDetail extends SheetRecord {
  myRoles: ProjectRole[];
  /** True for a viewer: the draft is withheld (its blocks empty); the revisions are theirs to read. */
  draftHidden?: boolean;
}

function duplicateNumber(number: string): ConflictError {
  return new ConflictError(`This project already has a sheet numbered ${number}.`, {
    code: 'DUPLICATE',
    field: 'number',
  });
}

async function mustFind(db: DbOrTx, sheetId: number): Promise<SheetRecord> {
  const sheet = await findSheetById(db, sheetId);
  if (!sheet) throw new NotFoundError(`There is no sheet with id ${sheetId}.`);
  return sheet;
}

export const sheetsService = {
  templates(): SheetTemplateInfo[] {
    return listTemplates();
  },

  async list({ db, access }: AppContext, user: User, projectId: number): Promise<SheetSummary[]> {
    await access.project(user, projectId, 'sheet.read');
    return listSheetsByProject(db, projectId);
  },

  async get({ db, access: policy }: AppContext, user: User, sheetId: number): Promise<SheetDetail> {
    const access = await policy.sheet(user, sheetId, 'sheet.read');
    const sheet = await mustFind(db, sheetId);
    // A viewer reads the issued revisions, not the unissued draft.
    if (!permits('sheet.read_internal', user, access.myRoles)) {
      return {
        ...sheet,
        draft: { blocks: [], settings: sheet.draft.settings },
        draftHidden: true,
        myRoles: access.myRoles,
      };
    }
    return { ...sheet, myRoles: access.myRoles };
  },

  async create(
    { db, access: policy }: AppContext,
    user: User,
    projectId: number,
    input: CreateSheetBody,
    /**
     * A draft to start from instead of a built-in template (a firm template), with what the
     * activity row records about it.
     */
    start?: { draft: SheetDraft; details: Record<string, unknown> },
  ): Promise<SheetDetail> {
    const access = await policy.project(user, projectId, 'sheet.create');
    const template = input.template ?? 'empty';
    const draft = start?.draft ?? draftFromTemplate(template);
    let id: number;
    try {
      id = await db.transaction(async (trx) => {
        const sheetId = await insertSheet(trx, {
          projectId,
          number: input.number,
          title: input.title,
          subject: input.subject ?? '',
          draft,
          userId: user.id,
        });
        await activityService.record(trx, {
          actorId: user.id,
          projectId,
          action: 'sheet.created',
          objectType: 'sheet',
          objectId: sheetId,
          details: {
            number: input.number,
            title: input.title,
            ...(start ? start.details : { template }),
          },
        });
        return sheetId;
      });
    } catch (e) {
      if (isDuplicateKeyError(e)) throw duplicateNumber(input.number);
      throw e;
    }
    const sheet = await mustFind(db, id);
    return { ...sheet, myRoles: access.myRoles };
  },

  async update(
    { db, access: policy }: AppContext,
    user: User,
    sheetId: number,
    input: UpdateSheetBody,
  ): Promise<SheetDetail> {
    const access = await policy.sheet(user, sheetId, 'sheet.rename');
    try {
      await db.transaction(async (trx) => {
        await lockSheet(trx, sheetId);
        const before = await mustFind(trx, sheetId);
        const changes: { number?: string; title?: string; subject?: string } = {};
        if (input.number !== undefined && input.number !== before.number) {
          // The number is printed on every issued revision and shown by /verify: it stays put.
          if ((await countRevisions(trx, sheetId)) > 0) {
            throw new ConflictError(
              `Sheet ${before.number} has been issued; its number is on the issued revisions and cannot change.`,
              { code: 'CONFLICT', field: 'number' },
            );
          }
          changes.number = input.number;
        }
        if (input.title !== undefined && input.title !== before.title) changes.title = input.title;
        if (input.subject !== undefined && input.subject !== before.subject) {
          changes.subject = input.subject;
        }
        if (Object.keys(changes).length === 0) return;
        await updateSheetFields(trx, sheetId, changes, user.id);
        const from: Record<string, string> = {};
        for (const key of Object.keys(changes) as (keyof typeof changes)[]) from[key] = before[key];
        await activityService.record(trx, {
          actorId: user.id,
          projectId: access.projectId,
          action: 'sheet.renamed',
          objectType: 'sheet',
          objectId: sheetId,
          details: { from, to: changes },
        });
      });
    } catch (e) {
      if (isDuplicateKeyError(e)) throw duplicateNumber(input.number ?? '');
      throw e;
    }
    const sheet = await mustFind(db, sheetId);
    return { ...sheet, myRoles: access.myRoles };
  },

  /**
   * Saves the draft when `expectedVersion` is still the current one (optimistic concurrency).
   * A stale version is refused with 409 DRAFT_CONFLICT carrying the current draft, so the editor
   * can show both versions and nothing is lost.
   */
  async saveDraft(
    { db, access: policy }: AppContext,
    user: User,
    sheetId: number,
    expectedVersion: number,
    input: DraftBody,
  ): Promise<DraftSaved> {
    const access = await policy.sheet(user, sheetId, 'sheet.edit');
    const draft: SheetDraft = { blocks: input.blocks, settings: input.settings };
    return db.transaction(async (trx) => {
      const saved = await saveDraftIfVersion(trx, sheetId, expectedVersion, draft, user.id);
      const current = await mustFind(trx, sheetId);
      if (!saved) {
        throw new AppError(
          409,
          'DRAFT_CONFLICT',
          `The draft was changed by ${current.updatedBy.name} since you opened it (you edited version ${expectedVersion}, the current one is ${current.draftVersion}). Both versions are kept: choose which to keep.`,
          {
            details: {
              current: {
                blocks: current.draft.blocks,
                settings: current.draft.settings,
                draftVersion: current.draftVersion,
                updatedAt: current.updatedAt,
                updatedBy: current.updatedBy,
              },
            } satisfies DraftConflictDetails,
          },
        );
      }
      const recent = await hasRecentDraftSavedActivity(
        trx,
        sheetId,
        user.id,
        DRAFT_SAVED_COALESCE_MINUTES,
      );
      if (!recent) {
        await activityService.record(trx, {
          actorId: user.id,
          projectId: access.projectId,
          action: 'sheet.draft_saved',
          objectType: 'sheet',
          objectId: sheetId,
          details: { number: current.number, draftVersion: current.draftVersion },
        });
      }
      return { draftVersion: current.draftVersion, updatedAt: current.updatedAt };
    });
  },

  /** Deletes a sheet that was never issued (its uploads go with it). */
  async remove({ db, access: policy }: AppContext, user: User, sheetId: number): Promise<void> {
    const access = await policy.sheet(user, sheetId, 'sheet.delete');
    await db.transaction(async (trx) => {
      await lockSheet(trx, sheetId);
      const sheet = await mustFind(trx, sheetId);
      if (sheet.status !== 'draft' || (await countRevisions(trx, sheetId)) > 0) {
        throw new ConflictError(
          `Sheet ${sheet.number} has been issued for check; an issued sheet is kept with its revisions and cannot be deleted.`,
          { code: 'CONFLICT' },
        );
      }
      await deleteSheet(trx, sheetId);
      await activityService.record(trx, {
        actorId: user.id,
        projectId: access.projectId,
        action: 'sheet.deleted',
        objectType: 'sheet',
        objectId: sheetId,
        details: { number: sheet.number, title: sheet.title },
      });
    });
  },

  /** The project a sheet belongs to (the access policy's way up); undefined when none. */
  projectIdOf(db: DbOrTx, sheetId: number): Promise<number | undefined> {
    return findSheetProjectId(db, sheetId);
  },

  /** The sheet with its project's job number, name, client and site, or undefined. */
  findContext(db: DbOrTx, sheetId: number): Promise<SheetContext | undefined> {
    return findSheetContext(db, sheetId);
  },

  /** The sheet with its project's job number, name, client and site; 404 when there is none. */
  async context(db: DbOrTx, sheetId: number): Promise<SheetContext> {
    const sheet = await findSheetContext(db, sheetId);
    if (!sheet) throw new NotFoundError(`There is no sheet with id ${sheetId}.`);
    return sheet;
  },

  /** The stored draft and its version (404 when there is no such sheet). */
  async draftOf(db: DbOrTx, sheetId: number): Promise<{ draft: SheetDraft; version: number }> {
    const sheet = await mustFind(db, sheetId);
    return { draft: sheet.draft, version: sheet.draftVersion };
  },

  /** Locks the sheet row for the rest of the transaction (serializes writes to one sheet). */
  lock(trx: Knex.Transaction, sheetId: number): Promise<void> {
    return lockSheet(trx, sheetId);
  },

  /** Sets the sheet's status inside a review action's transaction. */
  setStatus(trx: Knex.Transaction, sheetId: number, status: SheetStatus): Promise<void> {
    return setSheetStatus(trx, sheetId, status);
  },

  /** Evaluates a sheet with the uploads of sheet `sheetId`, frozen into canonical forms. */
  evaluate: evaluateWithUploads,

  /** As `evaluate`, answered from the results store when the same text was evaluated before. */
  evaluateStored,
};

/** The If-Match refusal: the header names the version the edit started from. */
export function missingIfMatch(): AppError {
  return new AppError(
    428,
    'PRECONDITION_REQUIRED',
    'Saving a draft needs the header If-Match: "<draftVersion>" with the version you started from, so that nobody else’s changes are overwritten.',
    { field: 'If-Match' },
  );
}
