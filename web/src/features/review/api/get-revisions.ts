import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import type { RevisionSummary } from './types';

export async function getRevisions(sheetId: number): Promise<RevisionSummary[]> {
  return (await api.get<{ revisions: RevisionSummary[] }>(`/api/sheets/${sheetId}/revisions`))
    .revisions;
}

export const getRevisionsQueryOptions = (sheetId: number) =>
  queryOptions({
    queryKey: ['revisions', 'list', sheetId],
    queryFn: () => getRevisions(sheetId),
  });

export const useRevisions = (sheetId: number) => useQuery(getRevisionsQueryOptions(sheetId));
