import type { PackageResponse } from '../../../core/contract/print';
import type { AppContext } from '../../http/context';
import { AppError } from '../../http/errors';
import { firmName, comparePrintService } from '../revisions/compare-print.service';
import type { RevisionSummary } from '../revisions/revisions.repository';
import { revisionsService } from '../revisions/revisions.service';
import { remarksService } from '../remarks/remarks.service';
import { projectsService } from '../projects/projects.service';
import { sheetsService } from '../sheets/sheets.service';
import type { User } from '../users/users.repository';

export type { CheckRecord, PackageSheet } from '../../../core/contract/print';

/** A project's calculation package (the contract's PackageResponse). */
export type CalculationPackage = PackageResponse;

/** The newest sealed revision of a sheet (a superseded one was sealed too, but is older). */
function latestSealed(revisions: readonly RevisionSummary[]): RevisionSummary | undefined {
  return [...revisions].filter((r) => r.sealCode !== null).sort((a, b) => b.number - a.number)[0];
}

function chosenRevisions(
  sheets: { id: number; number: string; revisions: RevisionSummary[] }[],
  asked: number[] | undefined,
): Map<number, number> {
  const chosen = new Map<number, number>();
  if (!asked) {
    for (const s of sheets) {
      const sealed = latestSealed(s.revisions);
      if (sealed) chosen.set(s.id, sealed.id);
    }
    return chosen;
  }
  for (const id of asked) {
    const sheet = sheets.find((s) => s.revisions.some((r) => r.id === id));
    if (!sheet) {
      throw new AppError(422, 'VALIDATION', `Revision ${id} is not a revision of this project.`, {
        field: 'revisions',
      });
    }
    if (chosen.has(sheet.id)) {
      throw new AppError(
        422,
        'VALIDATION',
        `Choose one revision of sheet ${sheet.number}, not two: a package binds one revision of each sheet.`,
        { field: 'revisions' },
      );
    }
    chosen.set(sheet.id, id);
  }
  return chosen;
}

export const packagesService = {
  /**
   * A project's calculation package: the chosen revisions (by default the latest sealed one of
   * each sheet) in sheet-number order, each with everything its print shows and the record of
   * check remarks and replies.
   */
  async compose(
    ctx: AppContext,
    user: User,
    projectId: number,
    asked: number[] | undefined,
  ): Promise<CalculationPackage> {
    // The sheets' list asks the access policy first (404 for no project, 403 for a stranger).
    const summaries = await sheetsService.list(ctx, user, projectId);
    const project = await projectsService.get(ctx.db, user, projectId);
    const sheets = await Promise.all(
      [...summaries]
        .sort((a, b) => a.number.localeCompare(b.number, 'en', { numeric: true }))
        .map(async (s) => ({
          id: s.id,
          number: s.number,
          title: s.title,
          revisions: await revisionsService.listBySheet(ctx.db, s.id),
        })),
    );
    const chosen = chosenRevisions(sheets, asked);
    const parts: CalculationPackage['parts'] = [];
    for (const s of sheets) {
      const revisionId = chosen.get(s.id);
      if (revisionId === undefined) continue;
      const print = await comparePrintService.print(ctx, user, revisionId);
      const remarks = await remarksService.listByRevision(ctx.db, revisionId);
      const order = new Map(print.blocks.map((b, i) => [b.id, i]));
      remarks.sort(
        (a, b) =>
          (order.get(a.blockId) ?? 0) - (order.get(b.blockId) ?? 0) ||
          a.line - b.line ||
          a.id - b.id,
      );
      parts.push({ ...print, record: { revisionId, remarks } });
    }
    const defaults = chosenRevisions(sheets, undefined);
    return {
      firm: { name: firmName() },
      project: {
        id: project.id,
        jobNumber: project.jobNumber,
        name: project.name,
        client: project.client,
        site: project.site,
      },
      sheets: sheets.map((s) => ({
        id: s.id,
        number: s.number,
        title: s.title,
        revisions: [...s.revisions]
          .sort((a, b) => b.number - a.number)
          .map((r) => ({ id: r.id, number: r.number, status: r.status, sealCode: r.sealCode })),
        chosenRevisionId: chosen.get(s.id) ?? null,
      })),
      parts,
      defaultChoice:
        chosen.size === defaults.size && [...chosen].every(([k, v]) => defaults.get(k) === v),
    };
  },
};
