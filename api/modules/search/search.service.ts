import type {
  BlockPlace,
  ProjectRef,
  RemarkSearchResult as RemarkResult,
  SearchAnswer,
  SheetSearchResult as SheetResult,
} from '../../../core/contract/search';
import type { Db } from '../../db/index';
import type { BlockKind } from '../../../core/index';
import { projectsService } from '../projects/projects.service';
import { remarksSearchRepository } from '../remarks/remarks-search.repository';
import { sheetsSearchRepository, type SheetHit } from '../sheets/sheets-search.repository';
import type { User } from '../users/users.repository';
import { holdsAnyWord, holdsWords, searchTerms } from './search-terms';

const LIMIT = 50;

// Where the words are and what holds them: the shapes are the contract's.
export type { BlockPlace, RemarkResult, SearchAnswer, SheetResult };

const READ_FIRST: readonly BlockKind[] = ['text', 'calc'];

function placeIn(hit: SheetHit, words: readonly string[]): BlockPlace | null {
  const ordered = hit.blocks
    .map((b, i) => ({ b, i }))
    .sort(
      (x, y) => Number(!READ_FIRST.includes(x.b.kind)) - Number(!READ_FIRST.includes(y.b.kind)),
    );
  let firstAny: BlockPlace | null = null;
  for (const { b, i } of ordered) {
    const lines = b.source.split('\n');
    for (let l = 0; l < lines.length; l++) {
      const text = lines[l]!;
      const place = { blockId: b.id, blockIndex: i + 1, blockKind: b.kind, line: l + 1, text };
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
   * sheet.read rules say) through the full-text indexes of sheets, remarks and replies.
   */
  async search(db: Db, user: User, typed: string): Promise<SearchAnswer> {
    const terms = searchTerms(typed);
    const projects = new Map<number, ProjectRef>(
      (await projectsService.list(db, user)).map((p) => [
        p.id,
        { id: p.id, jobNumber: p.jobNumber, name: p.name },
      ]),
    );
    const ids = [...projects.keys()];
    const [sheets, remarks] = await Promise.all([
      sheetsSearchRepository.search(db, ids, terms.booleanQuery, typed.trim(), LIMIT + 1),
      remarksSearchRepository.search(db, ids, terms.booleanQuery, LIMIT + 1),
    ]);
    const sheetResults: SheetResult[] = sheets.map((h) => ({
      kind: 'sheet',
      project: projects.get(h.projectId)!,
      sheet: { id: h.sheetId, number: h.number, title: h.title, subject: h.subject },
      fields: (['number', 'title', 'subject'] as const).filter(
        (f) => (f === 'number' && h.number === typed.trim()) || holdsAnyWord(h[f], terms.words),
      ),
      place: terms.words.length > 0 ? placeIn(h, terms.words) : null,
    }));
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
