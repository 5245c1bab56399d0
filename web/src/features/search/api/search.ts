import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';

import type {
  RemarkSearchResult as RemarkResult,
  SearchAnswer,
  SheetSearchResult as SheetResult,
} from '../../../../../core/contract/search';

export type { RemarkResult, SearchAnswer, SheetResult };

export async function search(q: string): Promise<SearchAnswer> {
  return api.get<SearchAnswer>(`/api/search?q=${encodeURIComponent(q)}`);
}

export const getSearchQueryOptions = (q: string) =>
  queryOptions({ queryKey: ['search', q], queryFn: () => search(q), enabled: q.trim() !== '' });

export const useSearch = (q: string) => useQuery(getSearchQueryOptions(q));
