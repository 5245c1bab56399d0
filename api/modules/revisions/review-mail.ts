import type { MailMessage } from '../../mail/mailer';
import type { SheetContext } from '../sheets/sheets.repository';
import { isGeneratedBlockId } from '../../../core/vocabulary';

/** Generated block ids (b + 12 hex digits) mean nothing to a reader; named ones do. */

/**
 * A block as the reader of a mail knows it: "block 2 (calc)", with the id the author gave it
 * ("block 2 (calc, storeys)"); the bare id when the revision has no such block.
 */
export function blockLabel(
  blocks: readonly { id: string; kind: string }[],
  blockId: string,
): string {
  const i = blocks.findIndex((b) => b.id === blockId);
  if (i < 0) return `block ${blockId}`;
  const named = isGeneratedBlockId(blockId) ? '' : `, ${blockId}`;
  return `block ${i + 1} (${blocks[i]!.kind}${named})`;
}

/** The texts of the messages sent to whoever must act next (DESIGN §6). */

function sheetLine(sheet: SheetContext): string {
  return `Sheet ${sheet.number} "${sheet.title}" — job no. ${sheet.projectJobNumber}, ${sheet.projectName}`;
}

const footer =
  '\n\n— Modewright. Results must be verified by a qualified engineer; built-in criteria do not ' +
  'replace the codes adopted by the authority having jurisdiction or licensed professional judgement.';

export function issuedMail(
  sheet: SheetContext,
  to: string[],
  rev: {
    number: number;
    purpose: string;
    issuedBy: string;
    remarksCarried: number;
    lineChanged: number;
  },
): MailMessage {
  const carried =
    rev.remarksCarried === 0
      ? ''
      : `\n${rev.remarksCarried} remark(s) carried over from the previous revision` +
        (rev.lineChanged > 0
          ? `, ${rev.lineChanged} of them on a line that changed — please look at those.`
          : '.');
  return {
    to,
    kind: 'revision.issued',
    relatedSheetId: sheet.id,
    subject: `[${sheet.projectJobNumber}] ${sheet.number} Rev ${rev.number} issued for check`,
    text:
      `${rev.issuedBy} issued Rev ${rev.number} for check.\n${sheetLine(sheet)}\nPurpose: ${rev.purpose}` +
      `${carried}\n\nPlease check it line by line, then return it or sign it off.${footer}`,
  };
}

const noteLines = (note: string | null) => (note ? `\n\nThe checker's note:\n${note}` : '');

/**
 * The labels of the failed criteria in a revision's stored results (the JSON text as stored), in
 * sheet order; none when the results cannot be read.
 */
export function failedCriteria(resultsText: string): string[] {
  let results: unknown;
  try {
    results = JSON.parse(resultsText);
  } catch {
    return [];
  }
  const blocks = (results as { blocks?: unknown } | null)?.blocks;
  if (!Array.isArray(blocks)) return [];
  return blocks.flatMap((b: { kind?: string; criteria?: { label: string; pass: boolean }[] }) =>
    b.kind === 'criteria' ? (b.criteria ?? []).filter((c) => !c.pass).map((c) => c.label) : [],
  );
}

export function returnedMail(
  sheet: SheetContext,
  to: string[],
  rev: { number: number; by: string; openRemarks: number; note: string | null },
): MailMessage {
  return {
    to,
    kind: 'revision.returned',
    relatedSheetId: sheet.id,
    subject: `[${sheet.projectJobNumber}] ${sheet.number} Rev ${rev.number} returned by the checker`,
    text:
      `${rev.by} returned Rev ${rev.number} with ${rev.openRemarks} remark(s) not closed.\n${sheetLine(sheet)}` +
      noteLines(rev.note) +
      `\n\nPlease answer the remarks, edit the draft and issue the next revision.${footer}`,
  };
}

export function remarkMail(
  sheet: SheetContext,
  to: string[],
  r: {
    revisionNumber: number;
    by: string;
    type: string;
    /** How the mail names the block: blockLabel(). */
    block: string;
    line: number;
    text: string;
  },
): MailMessage {
  return {
    to,
    kind: 'remark.added',
    relatedSheetId: sheet.id,
    subject: `[${sheet.projectJobNumber}] ${sheet.number} Rev ${r.revisionNumber}: new ${r.type} remark`,
    text:
      `${r.by} left a ${r.type} remark on ${r.block}, line ${r.line} of Rev ${r.revisionNumber}.` +
      `\n${sheetLine(sheet)}\n\n"${r.text}"${footer}`,
  };
}

export function signedOffMail(
  sheet: SheetContext,
  to: string[],
  rev: {
    number: number;
    by: string;
    note: string | null;
    purpose: string | null;
    failed: string[];
  },
): MailMessage {
  const failed =
    rev.failed.length === 0
      ? ''
      : `\n\nIt records ${rev.failed.length} failed criterion${rev.failed.length === 1 ? '' : 'a'}: ${rev.failed.join('; ')}.`;
  return {
    to,
    kind: 'revision.signed_off',
    relatedSheetId: sheet.id,
    subject: `[${sheet.projectJobNumber}] ${sheet.number} Rev ${rev.number} signed off — ready to seal`,
    text:
      `${rev.by} signed off Rev ${rev.number}${rev.purpose ? ` ${rev.purpose.replace(/^./, (c) => c.toLowerCase())}` : ''}; every remark is closed.\n${sheetLine(sheet)}` +
      noteLines(rev.note) +
      failed +
      `\n\nIt awaits your seal.${footer}`,
  };
}

export function sealedMail(
  sheet: SheetContext,
  to: string[],
  seal: { revisionNumber: number; by: string; code: string; supersededNumbers: number[] },
): MailMessage {
  const superseded =
    seal.supersededNumbers.length === 0
      ? ''
      : `\nIt supersedes Rev ${seal.supersededNumbers.join(', Rev ')}.`;
  return {
    to,
    kind: 'revision.sealed',
    relatedSheetId: sheet.id,
    subject: `[${sheet.projectJobNumber}] ${sheet.number} Rev ${seal.revisionNumber} sealed (${seal.code})`,
    text:
      `${seal.by} sealed Rev ${seal.revisionNumber}.\n${sheetLine(sheet)}\nSeal code: ${seal.code} — anyone can ` +
      `check it at /verify/${seal.code}.${superseded}${footer}`,
  };
}
