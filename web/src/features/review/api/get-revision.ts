import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import type { RevisionDetail } from './types';

export async function getRevision(revisionId: number): Promise<RevisionDetail> {
  return (await api.get<{ revision: RevisionDetail }>(`/api/revisions/${revisionId}`)).revision;
}

export const getRevisionQueryOptions = (revisionId: number) =>
  queryOptions({
    queryKey: ['revisions', 'detail', revisionId],
    queryFn: () => getRevision(revisionId),
  });

export const useRevision = (revisionId: number, enabled = true) =>
  useQuery({ ...getRevisionQueryOptions(revisionId), enabled });
