import { isDuplicateKeyError } from '../../db/index';
import type { AppContext } from '../../http/context';
import { ConflictError, ForbiddenError, NotFoundError, ValidationError } from '../../http/errors';
import { activityService } from '../activity/activity.service';
import { membersService } from '../members/members.service';
import { revisionAccess } from '../revisions/revisions.service';
import type { SheetBlock, SheetSettings } from '../sheets/sheets.repository';
import { sheetsService, type SheetDetail } from '../sheets/sheets.service';
import type { User } from '../users/users.repository';
import {
  templatesRepository,
  type FirmTemplate,
  type FirmTemplateSummary,
} from './templates.repository';
import type { SaveTemplateBody, StartSheetBody, UpdateTemplateBody } from './templates.schemas';

function duplicateName(name: string): ConflictError {
  return new ConflictError(`The firm already has a template named "${name}".`, {
    code: 'DUPLICATE',
    field: 'name',
  });
}

async function mustFind(ctx: AppContext, id: number): Promise<FirmTemplate> {
  const template = await templatesRepository.find(ctx.db, id);
  if (!template) throw new NotFoundError(`There is no firm template with id ${id}.`);
  return template;
}

/** Renaming or removing a template: an admin, or the person who saved it. */
function mayManage(user: User, template: FirmTemplateSummary): void {
  if (user.isAdmin || template.createdBy.id === user.id) return;
  throw new ForbiddenError(
    `Only an admin or ${template.createdBy.name}, who saved it, can change the template "${template.name}".`,
  );
}

/** What is copied: the draft, or the frozen blocks and settings of one of the sheet's revisions. */
async function sourceOf(ctx: AppContext, user: User, input: SaveTemplateBody) {
  if (input.revisionId) {
    const { rev, sheet } = await revisionAccess(ctx, user, input.revisionId, 'template.save');
    if (rev.sheetId !== input.sheetId) {
      throw new ValidationError(`Revision ${input.revisionId} is not a revision of this sheet.`, {
        field: 'revisionId',
      });
    }
    return {
      sheet,
      blocks: rev.blocks as SheetBlock[],
      settings: rev.settings,
      revision: { id: rev.id, number: rev.number },
    };
  }
  await ctx.access.sheet(user, input.sheetId, 'template.save');
  const [sheet, { draft }] = await Promise.all([
    sheetsService.context(ctx.db, input.sheetId),
    sheetsService.draftOf(ctx.db, input.sheetId),
  ]);
  return {
    sheet,
    blocks: draft.blocks,
    settings: draft.settings as unknown as Record<string, unknown>,
    revision: null,
  };
}

export const templatesService = {
  /** The firm's templates, for anyone signed in (starting a sheet still needs authorship). */
  /** The firm's templates, for its engineers (an admin, or an author, checker or principal). */
  async list(ctx: AppContext, user: User): Promise<FirmTemplateSummary[]> {
    if (!user.isAdmin && !(await membersService.isFirmEngineer(ctx.db, user.id))) {
      throw new ForbiddenError(
        "The firm's templates are for its engineers: you hold no author, checker or principal role in any project.",
      );
    }
    return templatesRepository.list(ctx.db);
  },

  /** Saves a sheet's draft or revision as a firm template (an author of its project, or an admin). */
  async save(ctx: AppContext, user: User, input: SaveTemplateBody): Promise<FirmTemplateSummary> {
    const source = await sourceOf(ctx, user, input);
    let id: number;
    try {
      id = await ctx.db.transaction(async (trx) => {
        const templateId = await templatesRepository.insert(trx, {
          name: input.name,
          description: input.description,
          blocks: source.blocks,
          settings: source.settings,
          origin: {
            projectId: source.sheet.projectId,
            jobNumber: source.sheet.projectJobNumber,
            sheetId: source.sheet.id,
            sheetNumber: source.sheet.number,
            revisionId: source.revision?.id ?? null,
            revisionNumber: source.revision?.number ?? null,
          },
          userId: user.id,
        });
        await activityService.record(trx, {
          actorId: user.id,
          projectId: source.sheet.projectId,
          action: 'template.saved',
          objectType: 'template',
          objectId: templateId,
          details: {
            name: input.name,
            sheetId: source.sheet.id,
            sheetNumber: source.sheet.number,
            revisionNumber: source.revision?.number ?? null,
          },
        });
        return templateId;
      });
    } catch (e) {
      if (isDuplicateKeyError(e)) throw duplicateName(input.name);
      throw e;
    }
    return mustFind(ctx, id);
  },

  async update(
    ctx: AppContext,
    user: User,
    id: number,
    input: UpdateTemplateBody,
  ): Promise<FirmTemplateSummary> {
    const before = await mustFind(ctx, id);
    mayManage(user, before);
    const changes = {
      ...(input.name !== undefined ? { name: input.name } : {}),
      ...(input.description !== undefined ? { description: input.description } : {}),
    };
    try {
      await ctx.db.transaction(async (trx) => {
        await templatesRepository.update(trx, id, changes, user.id);
        await activityService.record(trx, {
          actorId: user.id,
          projectId: before.origin.projectId,
          action: 'template.updated',
          objectType: 'template',
          objectId: id,
          details: { name: input.name ?? before.name, before: { name: before.name } },
        });
      });
    } catch (e) {
      if (isDuplicateKeyError(e) && input.name) throw duplicateName(input.name);
      throw e;
    }
    return mustFind(ctx, id);
  },

  async remove(ctx: AppContext, user: User, id: number): Promise<void> {
    const template = await mustFind(ctx, id);
    mayManage(user, template);
    await ctx.db.transaction(async (trx) => {
      await templatesRepository.remove(trx, id);
      await activityService.record(trx, {
        actorId: user.id,
        projectId: template.origin.projectId,
        action: 'template.deleted',
        objectType: 'template',
        objectId: id,
        details: { name: template.name },
      });
    });
  },

  /** A new sheet in a project from a firm template (the sheets rules: an author of that project). */
  async startSheet(
    ctx: AppContext,
    user: User,
    id: number,
    input: StartSheetBody,
  ): Promise<SheetDetail> {
    const template = await mustFind(ctx, id);
    const { projectId, ...sheet } = input;
    const settings: SheetSettings = {
      ...template.settings,
      significantFigures: template.settings.significantFigures ?? 4,
    };
    return sheetsService.create(ctx, user, projectId, sheet, {
      draft: { blocks: template.blocks.map((b) => ({ ...b })), settings },
      details: { firmTemplate: { id: template.id, name: template.name } },
    });
  },
};
