import type { Db, DbOrTx } from '../../db/index';
import { isDuplicateKeyError } from '../../db/index';
import { AppError, ConflictError, NotFoundError } from '../../http/errors';
import type { ProjectRole } from '../members/roles';
import { projectsService } from '../projects/projects.service';
import type { User } from '../users/users.repository';
import { checkProjectAccess, checkSheetAccess } from './sheets.access';
import { DRAFT_SAVED_COALESCE_MINUTES, recordSheetActivity } from './sheets.activity';
import {
  countRevisions,
  deleteSheet,
  findSheetById,
  hasRecentDraftSavedActivity,
  insertSheet,
  listSheetsByProject,
  lockSheet,
  saveDraftIfVersion,
  updateSheetFields,
  type SheetDraft,
  type SheetRecord,
  type SheetSummary,
} from './sheets.repository';
import type { CreateSheetBody, DraftBody, UpdateSheetBody } from './sheets.schemas';
import { draftFromTemplate, listTemplates, type SheetTemplateInfo } from './sheets.templates';

/** A sheet as the API sends it: the stored record and the caller's roles in its project. */
export interface SheetDetail extends SheetRecord {
  myRoles: ProjectRole[];
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

  async list(db: Db, user: User, projectId: number): Promise<SheetSummary[]> {
    await requireProject(db, projectId);
    await checkProjectAccess(db, user, projectId);
    return listSheetsByProject(db, projectId);
  },

  async get(db: Db, user: User, sheetId: number): Promise<SheetDetail> {
    const access = await checkSheetAccess(db, user, sheetId);
    const sheet = await mustFind(db, sheetId);
    return { ...sheet, myRoles: access.myRoles };
  },

  async create(
    db: Db,
    user: User,
    projectId: number,
    input: CreateSheetBody,
  ): Promise<SheetDetail> {
    await requireProject(db, projectId);
    const access = await checkProjectAccess(db, user, projectId, ['author'], 'start a sheet');
    const template = input.template ?? 'empty';
    const draft = draftFromTemplate(template);
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
        await recordSheetActivity(trx, {
          actorId: user.id,
          projectId,
          action: 'sheet.created',
          objectType: 'sheet',
          objectId: sheetId,
          details: { number: input.number, title: input.title, template },
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

  async update(db: Db, user: User, sheetId: number, input: UpdateSheetBody): Promise<SheetDetail> {
    const access = await checkSheetAccess(db, user, sheetId, ['author'], 'rename a sheet');
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
        await recordSheetActivity(trx, {
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
    db: Db,
    user: User,
    sheetId: number,
    expectedVersion: number,
    input: DraftBody,
  ): Promise<{ draftVersion: number; updatedAt: Date }> {
    const access = await checkSheetAccess(db, user, sheetId, ['author'], 'edit a sheet');
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
            },
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
        await recordSheetActivity(trx, {
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
  async remove(db: Db, user: User, sheetId: number): Promise<void> {
    const access = await checkSheetAccess(db, user, sheetId, ['author'], 'delete a sheet');
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
      await recordSheetActivity(trx, {
        actorId: user.id,
        projectId: access.projectId,
        action: 'sheet.deleted',
        objectType: 'sheet',
        objectId: sheetId,
        details: { number: sheet.number, title: sheet.title },
      });
    });
  },
};

async function requireProject(db: Db, projectId: number): Promise<void> {
  if (!(await projectsService.exists(db, projectId))) {
    throw new NotFoundError(`There is no project with id ${projectId}.`);
  }
}

/** The If-Match refusal: the header names the version the edit started from. */
export function missingIfMatch(): AppError {
  return new AppError(
    428,
    'PRECONDITION_REQUIRED',
    'Saving a draft needs the header If-Match: "<draftVersion>" with the version you started from, so that nobody else’s changes are overwritten.',
    { field: 'If-Match' },
  );
}
