import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import type { Remark } from './types';

export async function getRemarks(revisionId: number): Promise<Remark[]> {
  return (await api.get<{ remarks: Remark[] }>(`/api/revisions/${revisionId}/remarks`)).remarks;
}

export const getRemarksQueryOptions = (revisionId: number) =>
  queryOptions({
    queryKey: ['remarks', 'list', revisionId],
    queryFn: () => getRemarks(revisionId),
  });

export const useRemarks = (revisionId: number, enabled = true) =>
  useQuery({ ...getRemarksQueryOptions(revisionId), enabled });
