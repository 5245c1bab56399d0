import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';

type ProjectRef = { id: number; jobNumber: string; name: string };

export type SheetResult = {
  kind: 'sheet';
  project: ProjectRef;
  sheet: { id: number; number: string; title: string; subject: string };
  fields: ('number' | 'title' | 'subject')[];
  /** In the draft (`revision` null), or in the newest revision for a viewer. */
  place: {
    revision: { id: number; number: number } | null;
    blockId: string;
    blockIndex: number;
    blockKind: string;
    line: number;
    text: string;
  } | null;
};

export type RemarkResult = {
  kind: 'remark' | 'reply';
  project: ProjectRef;
  sheet: { id: number; number: string; title: string };
  revision: { id: number; number: number };
  remarkId: number;
  blockId: string;
  line: number;
  text: string;
};

export type SearchAnswer = {
  query: string;
  words: string[];
  skipped: { word: string; reason: 'short' | 'common' }[];
  results: (SheetResult | RemarkResult)[];
  truncated: boolean;
};

export async function search(q: string): Promise<SearchAnswer> {
  return api.get<SearchAnswer>(`/api/search?q=${encodeURIComponent(q)}`);
}

export const getSearchQueryOptions = (q: string) =>
  queryOptions({ queryKey: ['search', q], queryFn: () => search(q), enabled: q.trim() !== '' });

export const useSearch = (q: string) => useQuery(getSearchQueryOptions(q));
