import type {
  BlockPlace,
  ProjectRef,
  RemarkSearchResult as RemarkResult,
  SearchAnswer,
  SheetSearchResult as SheetResult,
} from '../../../core/contract/search';
import type { Db } from '../../db/index';
import type { BlockKind } from '../../../core/index';
import { permits } from '../../http/access';
import { projectsService } from '../projects/projects.service';
import { revisionsRepository } from '../revisions/revisions.repository';
import { remarksSearchRepository } from '../remarks/remarks-search.repository';
import { sheetsSearchRepository } from '../sheets/sheets-search.repository';
import type { User } from '../users/users.repository';
import { holdsAnyWord, holdsWords, searchTerms } from './search-terms';

const LIMIT = 50;

// Where the words are and what holds them: the shapes are the contract's.
export type { BlockPlace, RemarkResult, SearchAnswer, SheetResult };

const READ_FIRST: readonly BlockKind[] = ['text', 'calc'];

function placeIn(
  blocks: readonly { id: string; kind: BlockKind; source: string }[],
  words: readonly string[],
  revision: BlockPlace['revision'],
): BlockPlace | null {
  if (words.length === 0) return null;
  const ordered = blocks
    .map((b, i) => ({ b, i }))
    .sort(
      (x, y) => Number(!READ_FIRST.includes(x.b.kind)) - Number(!READ_FIRST.includes(y.b.kind)),
    );
  let firstAny: BlockPlace | null = null;
  for (const { b, i } of ordered) {
    const lines = b.source.split('\n');
    for (let l = 0; l < lines.length; l++) {
      const text = lines[l]!;
      const place = {
        revision,
        blockId: b.id,
        blockIndex: i + 1,
        blockKind: b.kind,
        line: l + 1,
        text,
      };
      if (holdsWords(text, words)) return place;
      if (!firstAny && holdsAnyWord(text, words)) firstAny = place;
    }
  }
  return firstAny;
}

export const searchService = {
  /**
   * Searches the projects the person may open (an admin: every project; anyone else: the
   * projects they are a member of, in any role, as the access policy's project.read and
   * sheet.read rules say) through the full-text indexes of sheets, remarks and replies. A
   * person without sheet.read_internal (a viewer) finds a sheet only through what she may read:
   * its number, title, subject and newest revision.
   */
  async search(db: Db, user: User, typed: string): Promise<SearchAnswer> {
    const terms = searchTerms(typed);
    const projects = new Map<number, ProjectRef>();
    const draftReadable = new Set<number>();
    for (const p of await projectsService.list(db, user)) {
      projects.set(p.id, { id: p.id, jobNumber: p.jobNumber, name: p.name });
      if (permits('sheet.read_internal', user, p.myRoles)) draftReadable.add(p.id);
    }
    const ids = [...projects.keys()];
    const [sheets, remarks] = await Promise.all([
      sheetsSearchRepository.search(db, ids, terms.booleanQuery, typed.trim(), LIMIT + 1),
      remarksSearchRepository.search(db, ids, terms.booleanQuery, LIMIT + 1),
    ]);
    // A viewer reads issued revisions only: her places are in the newest one, and a sheet found
    // through words she cannot read (the draft's) is not hers to find.
    const issued = await revisionsRepository.latestBlocksOf(
      db,
      sheets.filter((h) => !draftReadable.has(h.projectId)).map((h) => h.sheetId),
    );
    const sheetResults: SheetResult[] = [];
    for (const h of sheets) {
      const fields = (['number', 'title', 'subject'] as const).filter(
        (f) => (f === 'number' && h.number === typed.trim()) || holdsAnyWord(h[f], terms.words),
      );
      let place: BlockPlace | null;
      if (draftReadable.has(h.projectId)) {
        place = placeIn(h.blocks, terms.words, null);
      } else {
        const rev = issued.get(h.sheetId);
        const readable = [
          h.number,
          h.title,
          h.subject,
          ...(rev?.blocks ?? []).map((b) => b.source),
        ];
        if (h.number !== typed.trim() && !holdsWords(readable.join('\n'), terms.words)) continue;
        place = rev ? placeIn(rev.blocks, terms.words, { id: rev.id, number: rev.number }) : null;
      }
      sheetResults.push({
        kind: 'sheet',
        project: projects.get(h.projectId)!,
        sheet: { id: h.sheetId, number: h.number, title: h.title, subject: h.subject },
        fields,
        place,
      });
    }
    const remarkResults: RemarkResult[] = remarks.map((h) => ({
      kind: h.replyId === null ? 'remark' : 'reply',
      project: projects.get(h.projectId)!,
      sheet: { id: h.sheetId, number: h.number, title: h.title },
      revision: { id: h.revisionId, number: h.revisionNumber },
      remarkId: h.remarkId,
      blockId: h.blockId,
      line: h.line,
      text: h.text,
    }));
    return {
      query: typed.trim(),
      words: terms.words,
      skipped: terms.skipped,
      results: [...sheetResults.slice(0, LIMIT), ...remarkResults.slice(0, LIMIT)],
      truncated: sheets.length > LIMIT || remarks.length > LIMIT,
    };
  },
};
