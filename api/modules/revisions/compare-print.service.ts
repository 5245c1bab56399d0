import {
  diffSheets,
  mapLine,
  type Sheet,
  type SheetBlock,
  type SheetResults,
} from '../../../core/index';
import { unitSystemOf } from '../../../core/display-units';
import type { CompareResponse, CompareSide, RemarkInContext } from '../../../core/contract/compare';
import type { PrintResponse } from '../../../core/contract/print';
import type { AppContext } from '../../http/context';
import { AppError } from '../../http/errors';
import type { User } from '../users/users.repository';
import { remarksService } from '../remarks/remarks.service';
import { sealsService } from '../seals/seals.service';
import { sheetsService } from '../sheets/sheets.service';
import { revisionWorkbook } from './revision-spreadsheet';
import type { RevisionRecord, RevisionSummary } from './revisions.repository';
import { revisionAccess, revisionsService, sheetOf } from './revisions.service';

/** DESIGN §12, on every print. */
export const CAUTION =
  'Results must be verified by a qualified engineer; built-in criteria do not replace the codes ' +
  'adopted by the authority having jurisdiction or licensed professional judgement.';

/** The firm printed in the title block (MW_FIRM_NAME; the demo firm by default). */
export function firmName(): string {
  return process.env.MW_FIRM_NAME ?? 'Brackwater Structural Ltd';
}

async function revisionOfSheet(
  ctx: AppContext,
  sheetId: number,
  revisionId: number,
  field: string,
): Promise<RevisionRecord> {
  const rev = await revisionsService.find(ctx.db, revisionId);
  if (!rev || rev.sheetId !== sheetId) {
    throw new AppError(
      422,
      'VALIDATION',
      `Revision ${revisionId} is not a revision of this sheet.`,
      { field },
    );
  }
  return rev;
}

export const comparePrintService = {
  /**
   * Compare two revisions, or a revision and the draft: per-block source changes with line
   * hunks, result changes and flipped criteria (the sheet engine's diff), and the remarks of both
   * sides with where their lines are on the other side.
   */
  async compare(
    ctx: AppContext,
    user: User,
    sheetId: number,
    fromId: number,
    to: number | 'draft',
  ): Promise<CompareResponse> {
    // The draft side is the firm's working copy: a viewer compares issued revisions.
    await ctx.access.sheet(user, sheetId, to === 'draft' ? 'sheet.read_internal' : 'sheet.read');
    const from = await revisionOfSheet(ctx, sheetId, fromId, 'from');
    const fromSheet = sheetOf(from);
    const fromResults = JSON.parse(from.resultsText) as SheetResults;
    let toSheet: Sheet;
    let toResults: SheetResults;
    let toSide: CompareSide;
    let toRev: RevisionRecord | null = null;
    if (to === 'draft') {
      const snapshot = await sheetsService.draftOf(ctx.db, sheetId);
      toSheet = {
        blocks: snapshot.draft.blocks as SheetBlock[],
        settings: snapshot.draft.settings ?? {},
      };
      toResults = (await sheetsService.evaluate(ctx, sheetId, toSheet)).results;
      toSide = { kind: 'draft', draftVersion: snapshot.version };
    } else {
      toRev = await revisionOfSheet(ctx, sheetId, to, 'to');
      toSheet = sheetOf(toRev);
      toResults = JSON.parse(toRev.resultsText) as SheetResults;
      toSide = {
        kind: 'revision',
        id: toRev.id,
        number: toRev.number,
        status: toRev.status,
        issuedAt: toRev.issuedAt,
      };
    }
    const diff = diffSheets(fromSheet, toSheet, fromResults, toResults);
    const remarks: RemarkInContext[] = [];
    for (const r of await remarksService.listByRevision(ctx.db, from.id)) {
      const m = mapLine(fromSheet, toSheet, { blockId: r.blockId, line: r.line });
      remarks.push({
        ...r,
        revisionNumber: from.number,
        mapped: m.status === 'gone' ? { status: 'gone', blockId: null, line: null } : m,
      });
    }
    if (toRev) {
      for (const r of await remarksService.listByRevision(ctx.db, toRev.id)) {
        remarks.push({
          ...r,
          revisionNumber: toRev.number,
          mapped: { status: 'same', blockId: r.blockId, line: r.line },
        });
      }
    }
    return {
      from: {
        kind: 'revision',
        id: from.id,
        number: from.number,
        status: from.status,
        issuedAt: from.issuedAt,
      },
      to: toSide,
      // The display unit system of each side (the sheet setting "Units shown").
      units: { from: unitSystemOf(fromSheet.settings), to: unitSystemOf(toSheet.settings) },
      blocks: diff.blocks,
      results: diff.results,
      flipped: diff.flipped,
      summary: diff.summary,
      remarks,
    };
  },

  /**
   * The revision's results tables (modes, response results, criteria) as an .xlsx workbook in the
   * revision's display units, for anyone who may read the revision.
   */
  async spreadsheet(ctx: AppContext, user: User, revisionId: number) {
    const { rev, sheet } = await revisionAccess(ctx, user, revisionId, 'sheet.read');
    const bytes = await revisionWorkbook({
      firm: firmName(),
      project: { jobNumber: sheet.projectJobNumber, name: sheet.projectName },
      sheet: { number: sheet.number, title: sheet.title },
      revision: { number: rev.number, status: rev.status, engineVersion: rev.engineVersion },
      system: unitSystemOf(rev.settings),
      results: JSON.parse(rev.resultsText) as SheetResults,
      caution: CAUTION,
    });
    const stem = `${sheet.number}_Rev${rev.number}`.replace(/[^A-Za-z0-9._-]+/g, '_');
    return { fileName: `${stem}_tables.xlsx`, bytes };
  },

  /** Everything the print view needs, in one call. */
  async print(ctx: AppContext, user: User, revisionId: number): Promise<PrintResponse> {
    const { rev, sheet } = await revisionAccess(ctx, user, revisionId, 'sheet.read');
    const history: RevisionSummary[] = await revisionsService.listBySheet(ctx.db, sheet.id);
    const sealed = await sealsService.viewOf(ctx.db, rev.id);
    return {
      firm: { name: firmName() },
      project: {
        id: sheet.projectId,
        jobNumber: sheet.projectJobNumber,
        name: sheet.projectName,
        client: sheet.projectClient,
        site: sheet.projectSite,
      },
      sheet: { id: sheet.id, number: sheet.number, title: sheet.title, subject: sheet.subject },
      revision: {
        id: rev.id,
        number: rev.number,
        status: rev.status,
        // what the principal sealed it or the checker signed it off for, when they said
        purpose: rev.sealedPurpose ?? rev.checkedPurpose ?? rev.purpose,
        preparedBy: rev.issuedBy,
        preparedAt: rev.issuedAt,
        checkedBy: rev.checkedBy,
        checkedAt: rev.checkedAt,
        sealedBy: rev.sealedBy,
        sealedAt: rev.sealedAt,
        digests: rev.digests,
        engineVersion: rev.engineVersion,
        preliminary: rev.status !== 'sealed' && rev.status !== 'superseded',
        banner:
          rev.status === 'sealed' || rev.status === 'superseded'
            ? null
            : `Preliminary — not for construction. ${rev.purpose}`,
      },
      history: history.map((h) => ({
        number: h.number,
        status: h.status,
        purpose: h.sealedPurpose ?? h.checkedPurpose ?? h.purpose,
        issuedBy: h.issuedBy,
        issuedAt: h.issuedAt,
        checkedBy: h.checkedBy,
        checkedAt: h.checkedAt,
        sealedBy: h.sealedBy,
        sealedAt: h.sealedAt,
        sealCode: h.sealCode,
      })),
      blocks: rev.blocks,
      settings: rev.settings,
      results: JSON.parse(rev.resultsText) as unknown,
      seal: sealed ? { ...sealed, verifyPath: `/verify/${sealed.code}` } : null,
      caution: CAUTION,
    };
  },
};
