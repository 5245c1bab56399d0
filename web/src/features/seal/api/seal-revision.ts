import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';

export type SealResponse = {
  revision: {
    id: number;
    sheetId: number;
    number: number;
    status: string;
    sealCode: string | null;
  };
  seal: { code: string; digest: string; sealedAt: string };
};

export async function sealRevision(revisionId: number, password: string): Promise<SealResponse> {
  return api.post<SealResponse>(`/api/revisions/${revisionId}/seal`, { password });
}

/** Sealing changes the revision, the sheet's revisions and status, and its history. */
export function useSealRevision(revisionId: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (password: string) => sealRevision(revisionId, password),
    onSuccess: (body) =>
      Promise.all([
        queryClient.invalidateQueries({ queryKey: ['revisions'] }),
        queryClient.invalidateQueries({ queryKey: ['sheets', 'list'] }),
        queryClient.invalidateQueries({ queryKey: ['sheets', 'review', body.revision.sheetId] }),
        queryClient.invalidateQueries({ queryKey: ['sheets', 'activity', body.revision.sheetId] }),
      ]),
  });
}
