// Issue for check (author), return and sign off (checker). Each changes the revision, the sheet's
// revision list, the sheet's status and its history.
import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import type { RevisionSummary } from './types';

export async function issueRevision(sheetId: number, purpose: string): Promise<RevisionSummary> {
  return (
    await api.post<{ revision: RevisionSummary }>(`/api/sheets/${sheetId}/revisions`, { purpose })
  ).revision;
}

/** The checker's covering note; with a sign-off, what the revision is checked for. */
export type CheckInput = { note: string; purpose?: string };

export async function returnRevision(
  revisionId: number,
  input: CheckInput,
): Promise<RevisionSummary> {
  return (
    await api.post<{ revision: RevisionSummary }>(`/api/revisions/${revisionId}/return`, {
      note: input.note,
    })
  ).revision;
}

export async function signOffRevision(
  revisionId: number,
  input: CheckInput,
): Promise<RevisionSummary> {
  return (
    await api.post<{ revision: RevisionSummary }>(`/api/revisions/${revisionId}/sign-off`, input)
  ).revision;
}

function useRefresh() {
  const queryClient = useQueryClient();
  return (revision: RevisionSummary) =>
    Promise.all([
      queryClient.invalidateQueries({ queryKey: ['revisions'] }),
      queryClient.invalidateQueries({ queryKey: ['sheets', 'list'] }),
      queryClient.invalidateQueries({ queryKey: ['sheets', 'review', revision.sheetId] }),
      queryClient.invalidateQueries({ queryKey: ['sheets', 'activity', revision.sheetId] }),
    ]);
}

export function useIssueRevision(sheetId: number) {
  const refresh = useRefresh();
  return useMutation({
    mutationFn: (purpose: string) => issueRevision(sheetId, purpose),
    onSuccess: refresh,
  });
}

export function useReturnRevision(revisionId: number) {
  const refresh = useRefresh();
  return useMutation({
    mutationFn: (input: CheckInput) => returnRevision(revisionId, input),
    onSuccess: refresh,
  });
}

export function useSignOffRevision(revisionId: number) {
  const refresh = useRefresh();
  return useMutation({
    mutationFn: (input: CheckInput) => signOffRevision(revisionId, input),
    onSuccess: refresh,
  });
}
