import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';

import type { SealResponse } from '../../../../../core/contract/revisions';

/** The password typed again, and optionally what the revision is sealed for. */
export type SealInput = { password: string; purpose?: string };

export async function sealRevision(revisionId: number, input: SealInput): Promise<SealResponse> {
  return api.post<SealResponse>(`/api/revisions/${revisionId}/seal`, input);
}

/** Sealing changes the revision, the sheet's revisions and status, and its history. */
export function useSealRevision(revisionId: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: SealInput) => sealRevision(revisionId, input),
    onSuccess: (body) =>
      Promise.all([
        queryClient.invalidateQueries({ queryKey: ['revisions'] }),
        queryClient.invalidateQueries({ queryKey: ['sheets', 'list'] }),
        queryClient.invalidateQueries({ queryKey: ['sheets', 'review', body.revision.sheetId] }),
        queryClient.invalidateQueries({ queryKey: ['sheets', 'activity', body.revision.sheetId] }),
      ]),
  });
}
